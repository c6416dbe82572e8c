import { LIMITS } from '@shared/domain/limits.ts';
import { PasswordResetEntity } from '@server/entities/password-reset.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';
import { hoursFromNow, newLinkToken } from './tokens.ts';

/** Creates a reset link for an active account; null (and nothing recorded) for an unknown address. */
export async function requestPasswordReset(
  ctx: ServiceContext,
  props: { email: string },
): Promise<{ user: UserEntity; token: string } | null> {
  const user = await ctx.manager.findOne(UserEntity, { where: { email: props.email, active: true } });
  if (!user) return null;
  const { token, tokenHash } = newLinkToken();
  const reset = await ctx.manager.save(
    ctx.manager.create(PasswordResetEntity, { userId: user.id, tokenHash, expiresAt: hoursFromNow(LIMITS.resetTtlHours), usedAt: null }),
  );
  await recordEvent(ctx.manager, { actorId: null, action: 'auth.password_reset_requested', entityType: 'user', entityId: user.id, summary: { resetId: reset.id, ip: ctx.ip ?? null } });
  return { user, token };
}
