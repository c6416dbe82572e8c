import { useCallback, useState, type FormEvent, type ReactNode } from 'react';
import type { z } from 'zod';
import { ApiError } from '@/lib/api-error.ts';

type Values = Record<string, string | boolean>;

/** Maps zod issues to one message per top-level field (the first issue wins). */
export function issuesToErrors(
  issues: ReadonlyArray<{ path: ReadonlyArray<PropertyKey>; message: string }>,
): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.map(String).join('.') || '_form';
    errors[key] ??= issue.message;
  }
  return errors;
}

/**
 * Form state validated by a shared zod schema: the same rules the server applies.
 * Field errors from the server (`fields[].path`) land beside the field they name;
 * anything else becomes the form-level message.
 */
export function useZodForm<S extends z.ZodType<unknown, Values>>(schema: S, initial: z.input<S> & Values) {
  const [values, setValues] = useState<Values>(initial);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const setValue = useCallback((name: string, value: string | boolean) => {
    setValues((v) => ({ ...v, [name]: value }));
    setErrors((e) => {
      if (!(name in e)) return e;
      const { [name]: _gone, ...rest } = e;
      return rest;
    });
  }, []);

  const bind = (name: keyof z.input<S> & string) => ({
    name,
    value: String(values[name] ?? ''),
    onChange: (e: { target: { value: string } }) => setValue(name, e.target.value),
  });

  /** Returns the parsed values, or null after showing the messages. */
  const validate = (): z.output<S> | null => {
    const parsed = schema.safeParse(values);
    if (parsed.success) {
      setErrors({});
      setFormError(null);
      return parsed.data;
    }
    setErrors(issuesToErrors(parsed.error.issues));
    return null;
  };

  const applyError = (error: unknown) => {
    if (error instanceof ApiError) {
      const byField: Record<string, string> = {};
      for (const f of error.fields) if (f.path in values) byField[f.path] = f.message;
      setErrors(byField);
      const unplaced = error.fields.filter((f) => !(f.path in values));
      setFormError(Object.keys(byField).length && !unplaced.length ? null : error.message);
    } else {
      setFormError(error instanceof Error ? error.message : 'Something went wrong.');
    }
  };

  const handleSubmit = (onValid: (data: z.output<S>) => void) => (e: FormEvent) => {
    e.preventDefault();
    const data = validate();
    if (data !== null) onValid(data);
  };

  const reset = (next: Values = initial) => {
    setValues(next);
    setErrors({});
    setFormError(null);
  };

  return { values, setValue, bind, errors, formError, setFormError, applyError, handleSubmit, reset };
}

/** A form-level problem, announced to screen readers. */
export function FormAlert({ children, tone = 'error' }: { children: ReactNode; tone?: 'error' | 'success' }) {
  if (!children) return null;
  const cls =
    tone === 'error'
      ? 'border-unstable bg-unstable-soft text-unstable'
      : 'border-success bg-success-soft text-success';
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      className={`rounded-md border-l-4 px-3 py-2 text-sm font-medium ${cls}`}
    >
      {children}
    </div>
  );
}
