import { diffLines } from 'diff';
import { useMemo } from 'react';
import { documentToPlainText, type DocumentJson } from '@shared/editor/document.ts';
import { cn } from '@/components/ui/cn.ts';

export interface DiffSide {
  title: string;
  entryDate: string;
  tags: string[];
  document: DocumentJson;
}

/** The entry as lines of text (title, date and tags first) for a readable diff. */
export function entryText(e: DiffSide): string {
  return (
    [
      `Title: ${e.title}`,
      `Date: ${e.entryDate}`,
      `Tags: ${e.tags.join(', ') || '—'}`,
      '',
      documentToPlainText(e.document),
    ].join('\n') + '\n'
  );
}

/** Line-by-line differences between two versions of an entry: removed lines struck red, added lines green. */
export function TextDiff({
  from,
  to,
  emptyText = 'No differences.',
}: {
  from: DiffSide;
  to: DiffSide;
  emptyText?: string;
}) {
  const parts = useMemo(() => diffLines(entryText(from), entryText(to)), [from, to]);
  const changed = parts.some((p) => p.added || p.removed);
  if (!changed) return <p className="text-sm text-ink-muted">{emptyText}</p>;
  return (
    <pre className="max-h-72 overflow-auto rounded-md border border-rule bg-paper p-3 font-mono text-xs leading-relaxed whitespace-pre-wrap">
      {parts.map((p, i) => {
        if (!p.added && !p.removed) {
          const lines = p.value.split('\n');
          // Unchanged stretches: a line of context either side, not the whole entry.
          const shown = lines.length > 4 ? [lines[0], '…', lines[lines.length - 2], ''].join('\n') : p.value;
          return (
            <span key={i} className="text-ink-muted">
              {shown}
            </span>
          );
        }
        return (
          <span
            key={i}
            className={cn(
              'block',
              p.added ? 'bg-success-soft text-success' : 'bg-unstable-soft text-unstable line-through',
            )}
          >
            {p.value
              .replace(/\n$/, '')
              .split('\n')
              .map((l) => `${p.added ? '+ ' : '− '}${l}`)
              .join('\n')}
          </span>
        );
      })}
    </pre>
  );
}
