import type { Notebook } from '@shared/api/notebooks.ts';
import { NotebookRoleBadge } from '@/components/ui/badge.tsx';
import { EmptyState } from '@/components/ui/empty-state.tsx';
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
      <EmptyState title="No entries yet">
        Entries are the dated pages of this log. Each one holds written notes beside live computation: the
        model&apos;s equations, equilibria and the branches followed through a parameter, the folds found on
        them with their eigenvalues and stability, bistable regions in two parameters, and simulated
        trajectories. Every save is kept as a revision, and the principal investigator reviews and signs them.
      </EmptyState>
    </section>
  );
}
