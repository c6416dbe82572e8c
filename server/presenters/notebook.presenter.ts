import type { Notebook, NotebookSummary } from '@shared/api/notebooks.ts';
import type { NotebookRole } from '@shared/domain/roles.ts';
import type { NotebookEntity } from '@server/entities/notebook.entity.ts';

export interface NotebookView {
  notebook: NotebookEntity;
  role: NotebookRole;
  memberCount: number;
}

export const presentNotebookSummary = ({ notebook, role, memberCount }: NotebookView): NotebookSummary => ({
  id: notebook.id,
  title: notebook.title,
  description: notebook.description,
  role,
  memberCount,
  updatedAt: notebook.updatedAt.toISOString(),
});

export const presentNotebook = (view: NotebookView): Notebook => ({
  ...presentNotebookSummary(view),
  createdAt: view.notebook.createdAt.toISOString(),
});
