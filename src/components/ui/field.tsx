import { cloneElement, isValidElement, useId, type ReactElement, type ReactNode } from 'react';

type FieldProps = {
  label: string;
  /** One short line that says what to enter. */
  help?: ReactNode;
  error?: string;
  /** The control; it receives id, aria-describedby and aria-invalid. */
  children: ReactElement<Record<string, unknown>>;
  className?: string;
};

/** A labelled form control with help text and its validation message, wired for screen readers. */
export function Field({ label, help, error, children, className }: FieldProps) {
  const id = useId();
  const helpId = `${id}-help`;
  const errorId = `${id}-error`;
  const describedBy = [help ? helpId : null, error ? errorId : null].filter(Boolean).join(' ') || undefined;
  const control = isValidElement(children)
    ? cloneElement(children, {
        id,
        'aria-describedby': describedBy,
        'aria-invalid': error ? true : undefined,
      })
    : children;
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-ink">
        {label}
      </label>
      {control}
      {help && !error && (
        <p id={helpId} className="mt-1 text-xs text-ink-muted">
          {help}
        </p>
      )}
      {error && (
        <p id={errorId} className="mt-1 text-sm font-medium text-unstable">
          {error}
        </p>
      )}
    </div>
  );
}
