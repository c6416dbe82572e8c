import { useState, type InputHTMLAttributes } from 'react';
import { cn } from '@/components/ui/cn.ts';
import { controlClass } from '@/components/ui/input.tsx';

/** Text as typed, read as a number when it is one ("1e-3", "-0.5"); anything else is kept as text. */
export function readNumber(text: string): number | string {
  const t = text.trim();
  if (t !== '' && /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) {
    const n = Number(t);
    if (Number.isFinite(n)) return n;
  }
  return text;
}

type NumberInputProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'value' | 'onChange'> & {
  value: unknown;
  onValue: (v: number | string | undefined) => void;
  /** Empty text means "not set" (undefined) instead of an invalid value. */
  optional?: boolean;
};

/**
 * A number field that never loses what the author typed: half-typed text ("1e-") is stored as
 * text, so the entry can be saved and the cell shows "Enter a number" next to the field.
 */
export function NumberInput({ value, onValue, optional, className, ...rest }: NumberInputProps) {
  const shown = value === undefined || value === null ? '' : String(value);
  const [text, setText] = useState(shown);
  const [lastShown, setLastShown] = useState(shown);
  // A value changed from outside (undo, another field, a rebase) replaces the text, unless the
  // text already reads as that value (then what the author typed, e.g. "1.50", stays).
  if (shown !== lastShown) {
    setLastShown(shown);
    if (!(readNumber(text) === value || (text.trim() === '' && value === undefined))) setText(shown);
  }
  return (
    <input
      inputMode="decimal"
      spellCheck={false}
      autoComplete="off"
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        onValue(optional && e.target.value.trim() === '' ? undefined : readNumber(e.target.value));
      }}
      className={cn(controlClass, 'figures h-8 w-full min-w-0 px-2 text-sm', className)}
      {...rest}
    />
  );
}
