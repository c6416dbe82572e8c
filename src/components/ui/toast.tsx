import { useSyncExternalStore } from 'react';
import { cn } from './cn.ts';

export type ToastTone = 'info' | 'success' | 'error';
/** A toast may offer one action (Undo, Run again); taking it dismisses the toast. */
export type ToastAction = { label: string; onClick: () => void };
export type Toast = { id: number; tone: ToastTone; title: string; message?: string; action?: ToastAction };

let toasts: Toast[] = [];
let nextId = 1;
const listeners = new Set<() => void>();
const emit = () => listeners.forEach((l) => l());

/** A tiny store so non-React code (the API client) can raise toasts. */
export const toast = {
  show(t: Omit<Toast, 'id'>, ms = 6000): number {
    const id = nextId++;
    toasts = [...toasts, { ...t, id }].slice(-4);
    emit();
    if (ms > 0) setTimeout(() => toast.dismiss(id), ms);
    return id;
  },
  success: (title: string, message?: string) => toast.show({ tone: 'success', title, message }),
  error: (title: string, message?: string) => toast.show({ tone: 'error', title, message }, 10_000),
  /** Says what just happened and offers to take it back (kept on screen a little longer). */
  undoable: (title: string, undo: () => void, label = 'Undo') => toast.show({ tone: 'info', title, action: { label, onClick: undo } }, 10_000),
  dismiss(id: number) {
    toasts = toasts.filter((t) => t.id !== id);
    emit();
  },
};

function subscribe(l: () => void) {
  listeners.add(l);
  return () => listeners.delete(l);
}

const toneClass: Record<ToastTone, string> = {
  info: 'border-rule-strong',
  success: 'border-success',
  error: 'border-unstable',
};

/** Renders the toasts in a polite live region at the bottom right. */
export function Toaster() {
  const list = useSyncExternalStore(
    subscribe,
    () => toasts,
    () => toasts,
  );
  return (
    <div
      aria-live="polite"
      role="status"
      className="pointer-events-none fixed right-4 bottom-4 z-50 flex w-[min(24rem,calc(100vw-2rem))] flex-col gap-2"
    >
      {list.map((t) => (
        <div
          key={t.id}
          className={cn(
            'pointer-events-auto rounded-md border-l-4 bg-surface px-4 py-3 text-ink shadow-lg ring-1 ring-rule',
            toneClass[t.tone],
          )}
        >
          <div className="flex items-start gap-3">
            <div className="min-w-0 flex-1">
              <p className="text-sm font-semibold">{t.title}</p>
              {t.message && <p className="mt-0.5 text-sm text-ink-muted">{t.message}</p>}
            </div>
            {t.action && (
              <button
                type="button"
                onClick={() => {
                  toast.dismiss(t.id);
                  t.action?.onClick();
                }}
                className="min-h-6 rounded-sm px-2 text-sm font-semibold text-accent hover:bg-accent-soft"
              >
                {t.action.label}
              </button>
            )}
            <button
              type="button"
              onClick={() => toast.dismiss(t.id)}
              className="rounded-sm px-1 text-ink-muted hover:text-ink"
              aria-label="Dismiss notification"
            >
              ×
            </button>
          </div>
        </div>
      ))}
    </div>
  );
}
