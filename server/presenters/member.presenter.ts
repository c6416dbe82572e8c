import type { Member } from '@shared/api/notebooks.ts';
import type { MembershipEntity } from '@server/entities/membership.entity.ts';

/** A membership with its user loaded. */
export const presentMember = (m: MembershipEntity): Member => ({
  userId: m.userId,
  name: m.user.name,
  email: m.user.email,
  role: m.role,
  joinedAt: m.createdAt.toISOString(),
});
