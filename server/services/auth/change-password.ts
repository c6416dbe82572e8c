import { UserEntity } from '@server/entities/user.entity.ts';
import { ValidationError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';
import { endSessionsOf } from './end-sessions.ts';
import { hashPassword, verifyPassword } from './passwords.ts';

/** Changes the caller's own password after checking the current one; ends their other sessions. */
export async function changePassword(
  ctx: ServiceContext & { actor: UserEntity },
  props: { currentPassword: string; newPassword: string; keepSid?: string },
): Promise<void> {
  const user = await ctx.manager.findOneOrFail(UserEntity, { where: { id: ctx.actor.id } });
  if (!(await verifyPassword(user.passwordHash, props.currentPassword))) {
    throw new ValidationError('The current password is not right', [{ path: 'currentPassword', message: 'This is not your current password' }]);
  }
  user.passwordHash = await hashPassword(props.newPassword);
  await ctx.manager.save(user);
  await endSessionsOf(ctx.manager, user.id, props.keepSid);
  await recordEvent(ctx.manager, { actorId: user.id, action: 'auth.password_changed', entityType: 'user', entityId: user.id });
}
