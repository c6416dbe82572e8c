import type { EntityManager } from 'typeorm';
import type { UserEntity } from '@server/entities/user.entity.ts';

/** What every domain operation receives: who acts, and the transaction to act in. */
export interface ServiceContext {
  actor: UserEntity | null;
  manager: EntityManager;
  /** Client address, for the audit trail of sign-in events. */
  ip?: string;
}
