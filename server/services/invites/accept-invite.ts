import type { UserEntity } from '@server/entities/user.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';
import { createUser } from '@server/services/users/create-user.ts';
import { findOpenInvite } from './find-open-invite.ts';

/** Turns an open invite into an account with the chosen password. */
export async function acceptInvite(ctx: ServiceContext, props: { token: string; password: string; name?: string }): Promise<UserEntity> {
  const invite = await findOpenInvite(ctx.manager, props.token, true);
  const user = await createUser(ctx, { email: invite.email, name: props.name ?? invite.name, password: props.password, siteRole: invite.siteRole, via: 'invite' });
  invite.acceptedAt = new Date();
  await ctx.manager.save(invite);
  await recordEvent(ctx.manager, { actorId: user.id, action: 'invite.accepted', entityType: 'invite', entityId: invite.id, summary: { userId: user.id } });
  return user;
}
