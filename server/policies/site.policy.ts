import type { UserEntity } from '@server/entities/user.entity.ts';
import { ForbiddenError, UnauthenticatedError } from '@server/errors/index.ts';

export type SiteAction = 'administer';

/** Site-level rights: only administrators manage people and invitations. */
export function authorizeSite(user: UserEntity | undefined, action: SiteAction): UserEntity {
  if (!user) throw new UnauthenticatedError();
  if (action === 'administer' && user.siteRole !== 'administrator') {
    throw new ForbiddenError('Only a site administrator can do this');
  }
  return user;
}
