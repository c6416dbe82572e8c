import { IsNull, MoreThan } from 'typeorm';
import { PasswordResetEntity } from '@server/entities/password-reset.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { ValidationError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';
import { endSessionsOf } from './end-sessions.ts';
import { hashPassword } from './passwords.ts';
import { hashLinkToken } from './tokens.ts';

/** Sets a new password from a reset link (once, before it expires) and signs the person out everywhere. */
export async function completePasswordReset(ctx: ServiceContext, props: { token: string; password: string }): Promise<UserEntity> {
  const reset = await ctx.manager.findOne(PasswordResetEntity, {
    where: { tokenHash: hashLinkToken(props.token), usedAt: IsNull(), expiresAt: MoreThan(new Date()) },
    lock: { mode: 'pessimistic_write' },
  });
  const user = reset ? await ctx.manager.findOne(UserEntity, { where: { id: reset.userId, active: true } }) : null;
  if (!reset || !user) {
    throw new ValidationError('This reset link has expired or was already used', [
      { path: 'token', message: 'This reset link has expired or was already used: ask for a new one' },
    ]);
  }
  reset.usedAt = new Date();
  await ctx.manager.save(reset);
  user.passwordHash = await hashPassword(props.password);
  await ctx.manager.save(user);
  await endSessionsOf(ctx.manager, user.id);
  await recordEvent(ctx.manager, { actorId: user.id, action: 'auth.password_reset', entityType: 'user', entityId: user.id, summary: { resetId: reset.id } });
  return user;
}
