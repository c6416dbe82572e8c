import type { EntityManager } from 'typeorm';
import { MembershipEntity } from '@server/entities/membership.entity.ts';

/** Members of a notebook with their accounts, PIs first, then by name. */
export async function listMembers(manager: EntityManager, notebookId: string): Promise<MembershipEntity[]> {
  const rank = { pi: 0, researcher: 1, reader: 2 } as const;
  const members = await manager.find(MembershipEntity, { where: { notebookId }, relations: { user: true } });
  return members.sort((a, b) => rank[a.role] - rank[b.role] || a.user.name.localeCompare(b.user.name));
}
