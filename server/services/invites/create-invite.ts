import type { CreateInviteInput } from '@shared/api/auth.ts';
import { LIMITS } from '@shared/domain/limits.ts';
import { InviteEntity } from '@server/entities/invite.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { ConflictError } from '@server/errors/index.ts';
import { hoursFromNow, newLinkToken } from '@server/services/auth/tokens.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** An administrator invites a person by e-mail. Returns the invite and the one-time link token. */
export async function createInvite(
  ctx: ServiceContext & { actor: UserEntity },
  props: CreateInviteInput,
): Promise<{ invite: InviteEntity; token: string }> {
  if (await ctx.manager.exists(UserEntity, { where: { email: props.email } })) {
    throw new ConflictError('This person already has an account', [{ path: 'email', message: 'An account with this e-mail address already exists' }]);
  }
  const { token, tokenHash } = newLinkToken();
  const invite = await ctx.manager.save(
    ctx.manager.create(InviteEntity, {
      email: props.email,
      name: props.name,
      siteRole: props.siteRole,
      tokenHash,
      invitedById: ctx.actor.id,
      expiresAt: hoursFromNow(LIMITS.inviteTtlHours),
      acceptedAt: null,
    }),
  );
  invite.invitedBy = ctx.actor;
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'invite.created',
    entityType: 'invite',
    entityId: invite.id,
    summary: { email: invite.email, siteRole: invite.siteRole },
  });
  return { invite, token };
}
