import type { ReactNode } from 'react';

/** What an empty list will hold and how to fill it. */
export function EmptyState({
  title,
  children,
  action,
}: {
  title: string;
  children?: ReactNode;
  action?: ReactNode;
}) {
  return (
    <div className="rounded-lg border border-dashed border-rule-strong bg-surface px-6 py-10 text-center">
      <svg aria-hidden="true" viewBox="0 0 48 32" className="mx-auto mb-3 h-8 w-12 text-rule-strong">
        <path
          d="M24 4 L4 1 L4 29 L24 31 L44 29 L44 1 Z M24 4 L24 31"
          fill="none"
          stroke="currentColor"
          strokeWidth="1.5"
          strokeLinejoin="round"
        />
      </svg>
      <h3 className="font-serif text-lg font-bold text-ink">{title}</h3>
      {children && <div className="mx-auto mt-2 max-w-prose text-sm text-ink-muted">{children}</div>}
      {action && <div className="mt-5">{action}</div>}
    </div>
  );
}
