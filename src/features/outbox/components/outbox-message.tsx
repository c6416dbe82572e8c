import { useState } from 'react';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { cn } from '@/components/ui/cn.ts';
import { formatDateTime } from '@/lib/format.ts';
import { useOutboxMessage } from '../api/get-outbox-message.ts';

/** Plain-text http(s) links in a message, made clickable. */
export function linkify(text: string): Array<string | { href: string }> {
  const parts: Array<string | { href: string }> = [];
  let last = 0;
  for (const m of text.matchAll(/https?:\/\/[^\s<>"')]+/g)) {
    if (m.index > last) parts.push(text.slice(last, m.index));
    parts.push({ href: m[0] });
    last = m.index + m[0].length;
  }
  if (last < text.length) parts.push(text.slice(last));
  return parts;
}

export function OutboxMessageView({ id }: { id: string }) {
  const msg = useOutboxMessage(id);
  const [view, setView] = useState<'text' | 'html'>('text');
  if (msg.isPending) return <SkeletonBlock lines={8} label="Loading the message" />;
  if (msg.isError) return <QueryError error={msg.error} what="this message" />;
  const m = msg.data;
  return (
    <article aria-labelledby="message-subject" className="rounded-lg border border-rule bg-surface">
      <header className="border-b border-rule px-5 py-4">
        <h2 id="message-subject" className="font-serif text-xl font-bold text-ink">
          {m.subject}
        </h2>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
          <dt className="text-ink-muted">From</dt>
          <dd>{m.from}</dd>
          <dt className="text-ink-muted">To</dt>
          <dd>{m.to.join(', ')}</dd>
          <dt className="text-ink-muted">Received</dt>
          <dd className="figures">{formatDateTime(m.receivedAt)}</dd>
        </dl>
        {m.html && (
          <div
            role="group"
            aria-label="Show the message as"
            className="mt-3 inline-flex rounded-md border border-rule-strong text-sm"
          >
            {(['text', 'html'] as const).map((v) => (
              <button
                key={v}
                type="button"
                aria-pressed={view === v}
                onClick={() => setView(v)}
                className={cn(
                  'px-3 py-1',
                  view === v ? 'bg-accent text-on-accent' : 'text-ink hover:bg-sunken',
                )}
              >
                {v === 'text' ? 'Plain text' : 'Formatted'}
              </button>
            ))}
          </div>
        )}
      </header>
      {view === 'html' && m.html ? (
        // The mail's HTML runs in a sandbox with no scripts and no access to this page.
        <iframe
          title={`Formatted message: ${m.subject}`}
          sandbox="allow-popups allow-top-navigation-by-user-activation"
          srcDoc={m.html}
          className="h-[32rem] w-full bg-white"
        />
      ) : (
        <pre
          className="px-5 py-4 font-mono text-sm leading-relaxed whitespace-pre-wrap text-ink"
          data-testid="message-text"
        >
          {linkify(m.text).map((p, i) =>
            typeof p === 'string' ? (
              p
            ) : (
              <a key={i} href={p.href}>
                {p.href}
              </a>
            ),
          )}
        </pre>
      )}
    </article>
  );
}
