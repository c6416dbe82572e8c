import { cn } from './cn.ts';

/** A placeholder bar while content loads; screen readers hear the label once. */
export function Skeleton({ className }: { className?: string }) {
  return (
    <div
      aria-hidden="true"
      className={cn('rounded-sm bg-sunken [animation:bf-shimmer_1.6s_ease-in-out_infinite]', className)}
    />
  );
}

export function SkeletonBlock({ lines = 3, label = 'Loading…' }: { lines?: number; label?: string }) {
  return (
    <div role="status" aria-label={label} className="space-y-3">
      {Array.from({ length: lines }, (_, i) => (
        <Skeleton key={i} className={cn('h-4', i === lines - 1 ? 'w-2/3' : 'w-full')} />
      ))}
    </div>
  );
}

/**
 * Stand-in rows of a list or table while it loads, each as tall as a real row (`rowHeight`, a
 * Tailwind height class) so nothing jumps when the rows arrive; a header bar when `header` is set.
 */
export function SkeletonRows({ rows = 5, rowHeight = 'h-11', header = false, label = 'Loading…' }: { rows?: number; rowHeight?: string; header?: boolean; label?: string }) {
  return (
    <div role="status" aria-label={label} className={cn(header && 'overflow-hidden rounded-lg border border-rule bg-surface')}>
      {header && <div className="h-9 border-b border-rule bg-sunken" />}
      {Array.from({ length: rows }, (_, i) => (
        <div key={i} className={cn('flex items-center gap-4 px-3', rowHeight, header && 'border-b border-rule last:border-0')}>
          <Skeleton className="h-4 w-1/3" />
          <Skeleton className={cn('h-3', i % 2 ? 'w-1/4' : 'w-1/5')} />
          <Skeleton className="ml-auto h-3 w-16" />
        </div>
      ))}
    </div>
  );
}
