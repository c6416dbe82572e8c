import type { Notebook } from '@shared/api/notebooks.ts';
import { NotebookRoleBadge } from '@/components/ui/badge.tsx';
import { formatDate } from '@/lib/format.ts';

export function NotebookOverview({ notebook }: { notebook: Notebook }) {
  return (
    <section aria-labelledby="overview-heading" className="space-y-6">
      <header>
        <p className="mb-1 text-xs font-semibold tracking-widest text-ink-muted uppercase">Notebook</p>
        <h1 id="overview-heading" className="font-serif text-3xl font-bold text-ink">
          {notebook.title}
        </h1>
        <p className="mt-2 flex flex-wrap items-center gap-2 text-sm text-ink-muted">
          Your role: <NotebookRoleBadge role={notebook.role} />
          <span aria-hidden="true">·</span> opened {formatDate(notebook.createdAt)}
          <span aria-hidden="true">·</span> updated {formatDate(notebook.updatedAt)}
        </p>
      </header>
      {notebook.description ? (
        <div className="prose-log text-ink">
          {notebook.description.split(/\n{2,}/).map((p, i) => (
            <p key={i}>{p}</p>
          ))}
        </div>
      ) : (
        <p className="text-sm text-ink-muted italic">No description yet.</p>
      )}
    </section>
  );
}
