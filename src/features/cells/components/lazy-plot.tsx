import { lazy, Suspense, useEffect, useRef, useState } from 'react';
import type { VisualizationSpec } from 'vega-embed';
import type { TopLevelSpec } from 'vega-lite';
import { Skeleton } from '@/components/ui/skeleton.tsx';
import type { PlotClick } from './vega-plot.tsx';

const VegaPlot = lazy(() => import('./vega-plot.tsx'));

/**
 * A plot that loads the vega libraries only once it scrolls into view (IntersectionObserver);
 * until then, and while they load, a placeholder of the same height holds its place.
 */
export function LazyPlot({
  spec,
  label,
  height = 340,
  onClickDatum,
}: {
  spec: TopLevelSpec;
  label: string;
  height?: number;
  onClickDatum?: PlotClick;
}) {
  const ref = useRef<HTMLDivElement>(null);
  const [visible, setVisible] = useState(typeof IntersectionObserver === 'undefined');
  useEffect(() => {
    const el = ref.current;
    if (!el || visible) return;
    const io = new IntersectionObserver(
      (entries) => {
        if (entries.some((e) => e.isIntersecting)) {
          setVisible(true);
          io.disconnect();
        }
      },
      { rootMargin: '200px' },
    );
    io.observe(el);
    return () => io.disconnect();
  }, [visible]);
  const placeholder = <Skeleton className="h-full w-full" />;
  return (
    <div ref={ref} className="w-full" style={{ minHeight: height + 40 }} data-testid="plot">
      {visible ? (
        <Suspense fallback={<div style={{ height }}>{placeholder}</div>}>
          <VegaPlot spec={spec as VisualizationSpec} label={label} onClickDatum={onClickDatum} />
        </Suspense>
      ) : (
        <div style={{ height }} className="flex">
          {placeholder}
        </div>
      )}
    </div>
  );
}
