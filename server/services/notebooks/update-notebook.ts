import type { UpdateNotebookInput } from '@shared/api/notebooks.ts';
import type { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** Renames or re-describes a notebook. */
export async function updateNotebook(
  ctx: ServiceContext,
  props: { notebook: NotebookEntity; changes: UpdateNotebookInput },
): Promise<NotebookEntity> {
  const { notebook, changes } = props;
  const changed: Record<string, { from: string; to: string }> = {};
  for (const key of ['title', 'description'] as const) {
    const next = changes[key];
    if (next !== undefined && next !== notebook[key]) {
      changed[key] = { from: notebook[key], to: next };
      notebook[key] = next;
    }
  }
  if (Object.keys(changed).length === 0) return notebook;
  await ctx.manager.save(notebook);
  await recordEvent(ctx.manager, { actorId: ctx.actor?.id ?? null, action: 'notebook.updated', entityType: 'notebook', entityId: notebook.id, notebookId: notebook.id, summary: { changed } });
  return notebook;
}
