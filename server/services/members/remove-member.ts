import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';
import { assertNotLastPi, loadMembership } from './load-membership.ts';

/** A PI removes a member; the last PI cannot be removed. */
export async function removeMember(ctx: ServiceContext, props: { notebookId: string; userId: string }): Promise<void> {
  const membership = await loadMembership(ctx.manager, props.notebookId, props.userId);
  await assertNotLastPi(ctx.manager, membership, 'userId');
  await ctx.manager.delete(MembershipEntity, { id: membership.id });
  await recordEvent(ctx.manager, {
    actorId: ctx.actor?.id ?? null,
    action: 'membership.removed',
    entityType: 'membership',
    entityId: membership.id,
    notebookId: props.notebookId,
    summary: { userId: props.userId, role: membership.role },
  });
}
