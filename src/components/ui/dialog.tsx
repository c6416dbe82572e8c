import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Button, buttonClass, Spinner, type ButtonVariant } from './button.tsx';

type DialogProps = {
  open: boolean;
  onClose: () => void;
  title: string;
  description?: ReactNode;
  children: ReactNode;
};

/**
 * A modal dialog on the native <dialog> element: showModal() makes the rest of the page inert
 * (focus stays inside), Escape closes it, focus returns to whatever opened it.
 */
export function Dialog({ open, onClose, title, description, children }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descId = useId();
  const opener = useRef<Element | null>(null);

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    if (open && !el.open) {
      opener.current = document.activeElement;
      el.showModal();
    } else if (!open && el.open) {
      el.close();
      if (opener.current instanceof HTMLElement) opener.current.focus();
    }
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descId : undefined}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      onClick={(e) => {
        if (e.target === ref.current) onClose();
      }}
      className="m-auto w-[min(32rem,calc(100vw-2rem))] rounded-lg border border-rule bg-surface p-0 text-ink shadow-2xl backdrop:bg-[rgb(var(--bf-shadow)/0.45)]"
    >
      {open && (
        <div className="p-6">
          <div className="mb-4 flex items-start justify-between gap-4">
            <div>
              <h2 id={titleId} className="font-serif text-xl font-bold">
                {title}
              </h2>
              {description && (
                <div id={descId} className="mt-1 text-sm text-ink-muted">
                  {description}
                </div>
              )}
            </div>
            <button
              type="button"
              onClick={onClose}
              className="rounded-sm px-1.5 text-xl leading-none text-ink-muted hover:text-ink"
              aria-label="Close"
            >
              ×
            </button>
          </div>
          {children}
        </div>
      )}
    </dialog>
  );
}

/** The footer of a form in a dialog: cancel on the left of the main action. */
export function DialogActions({
  onCancel,
  submitLabel,
  busy,
}: {
  onCancel: () => void;
  submitLabel: string;
  busy?: boolean;
}) {
  return (
    <div className="flex justify-end gap-2 pt-2">
      <button type="button" onClick={onCancel} className={buttonClass('secondary')}>
        Cancel
      </button>
      <button type="submit" className={buttonClass('primary')} disabled={busy} aria-busy={busy || undefined}>
        {busy && <Spinner />}
        {submitLabel}
      </button>
    </div>
  );
}

type ConfirmButtonProps = {
  /** What the button says, and an accessible name naming what it acts on. */
  label: string;
  accessibleLabel?: string;
  variant?: ButtonVariant;
  disabled?: boolean;
  title: string;
  description: string;
  keepLabel: string;
  confirmLabel: string;
  busy?: boolean;
  /** Called on confirmation with a function that closes the dialog. */
  onConfirm: (close: () => void) => void;
};

/** A button that asks before doing something hard to undo. */
export function ConfirmButton(props: ConfirmButtonProps) {
  const [open, setOpen] = useState(false);
  const close = () => setOpen(false);
  return (
    <>
      <Button
        size="sm"
        variant={props.variant ?? 'danger'}
        disabled={props.disabled}
        onClick={() => setOpen(true)}
        aria-label={props.accessibleLabel}
      >
        {props.label}
      </Button>
      <Dialog open={open} onClose={close} title={props.title} description={props.description}>
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={close}>
            {props.keepLabel}
          </Button>
          <Button variant="danger" busy={props.busy} onClick={() => props.onConfirm(close)}>
            {props.confirmLabel}
          </Button>
        </div>
      </Dialog>
    </>
  );
}
