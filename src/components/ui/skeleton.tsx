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
