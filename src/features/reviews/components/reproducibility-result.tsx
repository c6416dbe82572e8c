import type { ReproducibilityReport } from '@shared/api/reviews.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { formatUtc } from './signature-block.tsx';

/** The outcome of rerunning every cell: "Reproduced", or exactly what differs, cell by cell. */
export function ReproducibilityResult({ report }: { report: ReproducibilityReport }) {
  const differing = report.cells.filter((c) => c.status === 'differs');
  return (
    <div className="rounded-md border border-rule bg-paper p-3 text-sm" data-testid="reproducibility">
      <p className="flex flex-wrap items-center gap-2">
        {report.status === 'reproduced' && <Badge tone="success">Reproduced</Badge>}
        {report.status === 'differs' && <Badge tone="warning">Differs</Badge>}
        {report.status === 'not-checked' && <Badge>Not checked</Badge>}
        <span className="text-ink-muted">
          {report.status === 'reproduced'
            ? `Every cell gave the same result again (within a relative ${report.tolerance}).`
            : report.status === 'differs'
              ? `${differing.length === 1 ? 'One cell' : `${differing.length} cells`} gave a different result when rerun.`
              : 'There was nothing to rerun, or the rerun ran out of time.'}
        </span>
      </p>
      {differing.length > 0 && (
        <ul className="mt-2 space-y-1">
          {differing.map((c) => (
            <li key={c.cellId}>
              <span className="font-medium">{c.kind} cell</span>
              <ul className="list-disc pl-5 text-ink-muted">
                {c.differences.map((d) => (
                  <li key={d}>{d}</li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      )}
      <p className="mt-2 text-xs text-ink-muted">
        Checked {formatUtc(report.checkedAt)} with engine {report.engineVersion}.
      </p>
    </div>
  );
}
