import type { ReactNode, SelectHTMLAttributes } from 'react';
import { cn } from '@/components/ui/cn.ts';
import { controlClass } from '@/components/ui/input.tsx';
import { NumberInput } from './number-input.tsx';

/** A compact labelled control with its message underneath. */
export function SmallField({
  label,
  error,
  children,
  className,
  hint,
}: {
  label: string;
  error?: string;
  children: ReactNode;
  className?: string;
  hint?: string;
}) {
  return (
    <label className={cn('block min-w-0', className)}>
      <span className="mb-0.5 block text-xs font-medium text-ink-muted">{label}</span>
      {children}
      {error ? (
        <span className="mt-0.5 block text-xs font-medium text-unstable">{error}</span>
      ) : hint ? (
        <span className="mt-0.5 block text-xs text-ink-muted">{hint}</span>
      ) : null}
    </label>
  );
}

export function SmallSelect({ className, ...rest }: SelectHTMLAttributes<HTMLSelectElement>) {
  return <select className={cn(controlClass, 'h-8 w-full min-w-0 px-2 pr-7 text-sm', className)} {...rest} />;
}

export function NumberField({
  label,
  value,
  onValue,
  error,
  optional,
  hint,
  className,
}: {
  label: string;
  value: unknown;
  onValue: (v: number | string | undefined) => void;
  error?: string;
  optional?: boolean;
  hint?: string;
  className?: string;
}) {
  return (
    <SmallField label={label} error={error} hint={hint} className={className}>
      <NumberInput
        value={value}
        onValue={onValue}
        optional={optional}
        aria-invalid={error ? true : undefined}
      />
    </SmallField>
  );
}

/** One number per name (initial values, start guesses), laid out in a row that wraps. */
export function ValuesRow({
  names,
  values,
  onValues,
  errorFor,
  optional,
  labelFor,
}: {
  names: readonly string[];
  values: Record<string, unknown> | undefined;
  onValues: (next: Record<string, unknown>) => void;
  errorFor: (name: string) => string | undefined;
  optional?: boolean;
  labelFor?: (name: string) => string;
}) {
  const current = values ?? {};
  return (
    <div className="flex flex-wrap gap-2">
      {names.map((n) => (
        <NumberField
          key={n}
          className="w-28"
          label={labelFor ? labelFor(n) : n}
          value={current[n]}
          optional={optional}
          error={errorFor(n)}
          onValue={(v) => {
            const next = { ...current };
            if (v === undefined) delete next[n];
            else next[n] = v;
            onValues(next);
          }}
        />
      ))}
    </div>
  );
}

/** An interval [lo, hi] per name (search box, parameter bounds). */
export function IntervalsRow({
  names,
  intervals,
  onIntervals,
  errorFor,
  fallback,
}: {
  names: readonly string[];
  intervals: Record<string, unknown> | undefined;
  onIntervals: (next: Record<string, unknown>) => void;
  errorFor: (name: string) => string | undefined;
  fallback: (name: string) => [number, number];
}) {
  const current = intervals ?? {};
  return (
    <div className="flex flex-wrap gap-x-5 gap-y-2">
      {names.map((n) => {
        const pair = Array.isArray(current[n]) ? (current[n] as unknown[]) : fallback(n);
        const set = (k: 0 | 1, v: unknown) => {
          const next = [...pair];
          next[k] = v;
          onIntervals({ ...current, [n]: next });
        };
        const error = errorFor(n);
        return (
          <div key={n}>
            <span className="mb-0.5 block text-xs font-medium text-ink-muted">
              <span className="font-mono">{n}</span> from … to
            </span>
            <div className="flex items-center gap-1">
              <NumberInput
                className="w-24"
                aria-label={`${n} lower end`}
                value={pair[0]}
                onValue={(v) => set(0, v)}
                aria-invalid={error ? true : undefined}
              />
              <span className="text-ink-muted">–</span>
              <NumberInput
                className="w-24"
                aria-label={`${n} upper end`}
                value={pair[1]}
                onValue={(v) => set(1, v)}
                aria-invalid={error ? true : undefined}
              />
            </div>
            {error && <span className="mt-0.5 block text-xs font-medium text-unstable">{error}</span>}
          </div>
        );
      })}
    </div>
  );
}
