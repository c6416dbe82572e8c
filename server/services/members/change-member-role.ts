import type { NotebookRole } from '@shared/domain/roles.ts';
import type { MembershipEntity } from '@server/entities/membership.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';
import { assertNotLastPi, loadMembership } from './load-membership.ts';

/** A PI changes a member's role; the last PI cannot be demoted. */
export async function changeMemberRole(ctx: ServiceContext, props: { notebookId: string; userId: string; role: NotebookRole }): Promise<MembershipEntity> {
  const membership = await loadMembership(ctx.manager, props.notebookId, props.userId);
  if (membership.role === props.role) return membership;
  if (props.role !== 'pi') await assertNotLastPi(ctx.manager, membership, 'role');
  const from = membership.role;
  membership.role = props.role;
  await ctx.manager.save(membership);
  await recordEvent(ctx.manager, {
    actorId: ctx.actor?.id ?? null,
    action: 'membership.changed',
    entityType: 'membership',
    entityId: membership.id,
    notebookId: props.notebookId,
    summary: { userId: props.userId, from, to: props.role },
  });
  return membership;
}
