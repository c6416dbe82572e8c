import type { EntityManager } from 'typeorm';
import type { NotebookRole } from '@shared/domain/roles.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { NotebookView } from '@server/presenters/notebook.presenter.ts';

/** The notebooks a person belongs to, most recently changed first, with their role and the member count. */
export async function listNotebooksOf(manager: EntityManager, userId: string): Promise<NotebookView[]> {
  const { entities, raw } = await manager
    .createQueryBuilder(NotebookEntity, 'n')
    .innerJoin('membership', 'm', 'm.notebook_id = n.id AND m.user_id = :userId', { userId })
    .addSelect('m.role', 'my_role')
    .addSelect('(SELECT count(*) FROM membership c WHERE c.notebook_id = n.id)::int', 'member_count')
    .orderBy('n.updated_at', 'DESC')
    .getRawAndEntities<{ n_id: string; my_role: NotebookRole; member_count: number }>();
  const byId = new Map(raw.map((r) => [r.n_id, r]));
  return entities.map((notebook) => {
    const row = byId.get(notebook.id)!;
    return { notebook, role: row.my_role, memberCount: row.member_count };
  });
}
