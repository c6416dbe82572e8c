import { useEffect, useState } from 'react';

/** Milliseconds since `startedAt` (epoch ms), ticking five times a second; 0 when not started. */
export function useElapsed(startedAt: number | undefined): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (startedAt === undefined) return;
    const t = setInterval(() => setNow(Date.now()), 200);
    return () => clearInterval(t);
  }, [startedAt]);
  return startedAt === undefined ? 0 : Math.max(0, now - startedAt);
}

/** "2.4 s", then whole seconds from ten on. */
export function formatSeconds(ms: number): string {
  return ms < 10_000 ? `${(ms / 1000).toFixed(1)} s` : `${Math.round(ms / 1000)} s`;
}

/**
 * Progress of a long action whose length is not known ahead (a rerun, an export): what is
 * happening, the time so far, and a moving bar. Takes the final height of what replaces it, so
 * nothing jumps when it ends.
 */
export function ElapsedProgress({ label, className }: { label: string; className?: string }) {
  const [startedAt] = useState(() => Date.now());
  const elapsed = useElapsed(startedAt);
  return (
    <div className={className} role="status">
      <p className="text-sm text-ink">
        {label} <span className="text-ink-muted">· {formatSeconds(elapsed)}</span>
      </p>
      <div className="mt-1.5 h-1.5 w-full overflow-hidden rounded-full bg-sunken" role="progressbar" aria-label={label} aria-valuetext={`${formatSeconds(elapsed)} so far`}>
        <div className="bf-indeterminate h-full w-1/3 rounded-full bg-accent" />
      </div>
    </div>
  );
}
