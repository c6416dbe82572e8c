import type { CreateNotebookInput } from '@shared/api/notebooks.ts';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import type { NotebookView } from '@server/presenters/notebook.presenter.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** Creates a notebook; its creator becomes its PI. */
export async function createNotebook(ctx: ServiceContext & { actor: UserEntity }, props: CreateNotebookInput): Promise<NotebookView> {
  const notebook = await ctx.manager.save(ctx.manager.create(NotebookEntity, { title: props.title, description: props.description }));
  const membership = await ctx.manager.save(ctx.manager.create(MembershipEntity, { notebookId: notebook.id, userId: ctx.actor.id, role: 'pi' }));
  await recordEvent(ctx.manager, { actorId: ctx.actor.id, action: 'notebook.created', entityType: 'notebook', entityId: notebook.id, notebookId: notebook.id, summary: { title: notebook.title } });
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'membership.added',
    entityType: 'membership',
    entityId: membership.id,
    notebookId: notebook.id,
    summary: { userId: ctx.actor.id, role: 'pi' },
  });
  return { notebook, role: 'pi', memberCount: 1 };
}
