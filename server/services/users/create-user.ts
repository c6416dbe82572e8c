import type { SiteRole } from '@shared/domain/roles.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { ConflictError } from '@server/errors/index.ts';
import { hashPassword } from '@server/services/auth/passwords.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** Creates an account (from an accepted invite, the demo seed or a test). */
export async function createUser(
  ctx: ServiceContext,
  props: { email: string; name: string; password: string; siteRole: SiteRole; via: string },
): Promise<UserEntity> {
  const email = props.email.toLowerCase();
  if (await ctx.manager.exists(UserEntity, { where: { email } })) {
    throw new ConflictError('An account with this e-mail address already exists', [{ path: 'email', message: 'An account with this e-mail address already exists' }]);
  }
  const user = await ctx.manager.save(
    ctx.manager.create(UserEntity, { email, name: props.name, siteRole: props.siteRole, active: true, passwordHash: await hashPassword(props.password) }),
  );
  await recordEvent(ctx.manager, {
    actorId: ctx.actor?.id ?? user.id,
    action: 'user.created',
    entityType: 'user',
    entityId: user.id,
    summary: { email, siteRole: props.siteRole, via: props.via },
  });
  return user;
}
