import { ApiError } from '@/lib/api-error.ts';
import { Button } from './button.tsx';

/** A failed load, said plainly, with a way to try again. */
export function QueryError({ error, what, onRetry }: { error: unknown; what: string; onRetry?: () => void }) {
  const message = error instanceof ApiError ? error.message : 'Something went wrong.';
  return (
    <div role="alert" className="rounded-lg border border-unstable bg-unstable-soft px-5 py-4 text-ink">
      <p className="font-semibold text-unstable">Could not load {what}.</p>
      <p className="mt-1 text-sm">{message}</p>
      {onRetry && (
        <Button variant="secondary" size="sm" className="mt-3" onClick={onRetry}>
          Try again
        </Button>
      )}
    </div>
  );
}
