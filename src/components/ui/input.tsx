import type { InputHTMLAttributes, SelectHTMLAttributes, TextareaHTMLAttributes } from 'react';
import { cn } from './cn.ts';

export const controlClass =
  'block w-full rounded-md border border-rule-strong bg-surface px-3 text-ink placeholder:text-ink-muted aria-[invalid=true]:border-unstable aria-[invalid=true]:ring-1 aria-[invalid=true]:ring-unstable disabled:opacity-60';

export function Input({ className, ...rest }: InputHTMLAttributes<HTMLInputElement>) {
  return <input className={cn(controlClass, 'h-10', className)} {...rest} />;
}

export function Textarea({ className, ...rest }: TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <textarea className={cn(controlClass, 'py-2 leading-relaxed', className)} {...rest} />;
}

type SelectProps = SelectHTMLAttributes<HTMLSelectElement> & {
  options?: ReadonlyArray<{ value: string; label: string }>;
};

export function Select({ className, options, children, ...rest }: SelectProps) {
  return (
    <select className={cn(controlClass, 'h-10 pr-8', className)} {...rest}>
      {options?.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
      {children}
    </select>
  );
}
