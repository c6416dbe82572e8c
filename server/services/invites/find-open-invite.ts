import { IsNull, MoreThan, type EntityManager } from 'typeorm';
import { InviteEntity } from '@server/entities/invite.entity.ts';
import { NotFoundError } from '@server/errors/index.ts';
import { hashLinkToken } from '@server/services/auth/tokens.ts';

/** The unexpired, unaccepted invite for a link token; NotFound otherwise. */
export async function findOpenInvite(manager: EntityManager, token: string, forUpdate = false): Promise<InviteEntity> {
  const invite = await manager.findOne(InviteEntity, {
    where: { tokenHash: hashLinkToken(token), acceptedAt: IsNull(), expiresAt: MoreThan(new Date()) },
    ...(forUpdate ? { lock: { mode: 'pessimistic_write' as const } } : {}),
  });
  if (!invite) throw new NotFoundError('This invitation has expired or was already used');
  return invite;
}
