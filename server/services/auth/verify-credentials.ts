import type { EntityManager } from 'typeorm';
import { UserEntity } from '@server/entities/user.entity.ts';
import { verifyPassword } from './passwords.ts';

/** The active user with this e-mail and password, or null. */
export async function verifyCredentials(manager: EntityManager, email: string, password: string): Promise<UserEntity | null> {
  const user = await manager.findOne(UserEntity, { where: { email: email.toLowerCase() } });
  const ok = await verifyPassword(user?.passwordHash ?? null, password);
  return ok && user && user.active ? user : null;
}
