import type { EntityManager } from 'typeorm';
import { InviteEntity } from '@server/entities/invite.entity.ts';

export const listInvites = (manager: EntityManager): Promise<InviteEntity[]> =>
  manager.find(InviteEntity, { relations: { invitedBy: true }, order: { createdAt: 'DESC' } });
