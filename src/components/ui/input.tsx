import type { InputHTMLAttributes, SelectHTMLAttributes, TextareaHTMLAttributes } from 'react';
import { cn } from './cn.ts';

export const controlClass =
  'block rounded-md border border-rule-strong bg-surface px-3 text-ink placeholder:text-ink-muted aria-[invalid=true]:border-unstable aria-[invalid=true]:ring-1 aria-[invalid=true]:ring-unstable disabled:opacity-60';

export function Input({ className, ...rest }: InputHTMLAttributes<HTMLInputElement>) {
  return (
    <input
      className={cn(controlClass, 'h-10 w-full read-only:bg-sunken read-only:text-ink-muted', className)}
      {...rest}
    />
  );
}

export function Textarea({ className, ...rest }: TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <textarea className={cn(controlClass, 'w-full py-2 leading-relaxed', className)} {...rest} />;
}

type SelectProps = SelectHTMLAttributes<HTMLSelectElement> & {
  options?: ReadonlyArray<{ value: string; label: string }>;
  /** A small select that sits inline (in a table row or a list). */
  compact?: boolean;
};

export function Select({ className, options, compact, children, ...rest }: SelectProps) {
  return (
    <select
      className={cn(controlClass, compact ? 'h-8 pr-7 text-sm' : 'h-10 w-full pr-8', className)}
      {...rest}
    >
      {options?.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
      {children}
    </select>
  );
}
