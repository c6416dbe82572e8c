import { SIGNATURE_MEANING_LABELS, type ReproducibilityReport, type Signature } from '@shared/api/reviews.ts';
import { cn } from '@/components/ui/cn.ts';

/** "2026-12-01 14:02 UTC": the signing time as recorded, in UTC, unambiguous in any locale. */
export function formatUtc(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}

export function reproducibilityWords(r: ReproducibilityReport): string {
  if (r.status === 'reproduced') return 'reproduced ✓';
  if (r.status === 'differs') return `not reproduced: ${r.differences.length === 1 ? '1 difference' : `${r.differences.length} differences`}`;
  return 'reproducibility not checked';
}

/**
 * An electronic signature as it stands on the record: meaning, printed name, date and time,
 * the content it is bound to, and the reproducibility check made when signing (with every
 * difference listed when the rerun did not match).
 */
export function SignatureBlock({ signature, className }: { signature: Signature; className?: string }) {
  const r = signature.reproducibility;
  const meaning = SIGNATURE_MEANING_LABELS[signature.meaning];
  return (
    <section
      aria-label={`Signature of ${signature.printedName}`}
      className={cn('rounded-md border border-success/40 bg-success-soft px-4 py-3 text-sm text-ink', className)}
      data-testid="signature-block"
    >
      <p>
        <strong className="font-semibold text-success">{meaning}</strong> — electronically signed by{' '}
        <strong className="font-semibold">{signature.printedName}</strong>, <time dateTime={signature.signedAt}>{formatUtc(signature.signedAt)}</time>; meaning:{' '}
        {signature.meaning}; content hash <code className="font-mono text-xs" title={signature.contentHash}>{signature.contentHash.slice(0, 12)}…</code>;{' '}
        <span className={r.status === 'reproduced' ? 'text-success' : 'text-warning'}>{reproducibilityWords(r)}</span>
      </p>
      {r.status === 'differs' && r.differences.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-xs text-ink-muted">
          {r.differences.map((d) => (
            <li key={d}>{d}</li>
          ))}
        </ul>
      )}
    </section>
  );
}
