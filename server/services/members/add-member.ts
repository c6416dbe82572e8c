import type { NotebookRole } from '@shared/domain/roles.ts';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { ConflictError, ValidationError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** A PI adds a person who has an account. */
export async function addMember(ctx: ServiceContext, props: { notebookId: string; email: string; role: NotebookRole }): Promise<MembershipEntity> {
  const user = await ctx.manager.findOne(UserEntity, { where: { email: props.email, active: true } });
  if (!user) {
    throw new ValidationError('No active account has this e-mail address', [
      { path: 'email', message: 'No active account has this e-mail address: invite the person first' },
    ]);
  }
  if (await ctx.manager.exists(MembershipEntity, { where: { notebookId: props.notebookId, userId: user.id } })) {
    throw new ConflictError('This person is already a member', [{ path: 'email', message: 'Already a member of this notebook' }]);
  }
  const membership = await ctx.manager.save(ctx.manager.create(MembershipEntity, { notebookId: props.notebookId, userId: user.id, role: props.role }));
  membership.user = user;
  await recordEvent(ctx.manager, {
    actorId: ctx.actor?.id ?? null,
    action: 'membership.added',
    entityType: 'membership',
    entityId: membership.id,
    notebookId: props.notebookId,
    summary: { userId: user.id, role: props.role },
  });
  return membership;
}
