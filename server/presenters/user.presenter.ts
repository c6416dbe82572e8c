import type { User } from '@shared/api/users.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';

export const presentUser = (u: UserEntity): User => ({
  id: u.id,
  email: u.email,
  name: u.name,
  siteRole: u.siteRole,
  active: u.active,
  createdAt: u.createdAt.toISOString(),
});
