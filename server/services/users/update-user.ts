import type { UpdateUserInput } from '@shared/api/users.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { ConflictError, NotFoundError } from '@server/errors/index.ts';
import { endSessionsOf } from '@server/services/auth/end-sessions.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';
import { isUuid } from '@server/services/ids.ts';

/**
 * An administrator changes a person's name, site role or whether the account is active.
 * The last active administrator cannot be demoted or deactivated. Deactivation signs the person out.
 */
export async function updateUser(ctx: ServiceContext, props: { userId: string; changes: UpdateUserInput }): Promise<UserEntity> {
  const user = isUuid(props.userId)
    ? await ctx.manager.findOne(UserEntity, { where: { id: props.userId }, lock: { mode: 'pessimistic_write' } })
    : null;
  if (!user) throw new NotFoundError('No such person');
  const { changes } = props;
  const losesAdmin = user.siteRole === 'administrator' && user.active && (changes.siteRole === 'member' || changes.active === false);
  if (losesAdmin) {
    await ctx.manager.query(`SELECT pg_advisory_xact_lock(hashtext('app_user.administrators'))`);
    const admins = await ctx.manager.count(UserEntity, { where: { siteRole: 'administrator', active: true } });
    if (admins <= 1) {
      throw new ConflictError('The last active administrator cannot be demoted or deactivated', [
        { path: changes.active === false ? 'active' : 'siteRole', message: 'Make someone else an administrator first' },
      ]);
    }
  }
  const before = { name: user.name, siteRole: user.siteRole, active: user.active };
  Object.assign(user, changes);
  await ctx.manager.save(user);
  if (changes.active === false) await endSessionsOf(ctx.manager, user.id);
  const changed = Object.fromEntries(
    (Object.keys(changes) as (keyof typeof before)[]).filter((k) => before[k] !== user[k]).map((k) => [k, { from: before[k], to: user[k] }]),
  );
  await recordEvent(ctx.manager, { actorId: ctx.actor?.id ?? null, action: 'user.updated', entityType: 'user', entityId: user.id, summary: { changed } });
  return user;
}
