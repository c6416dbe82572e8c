import type { Invite } from '@shared/api/auth.ts';
import type { InviteEntity } from '@server/entities/invite.entity.ts';

/** An invite with `invitedBy` loaded. */
export const presentInvite = (i: InviteEntity): Invite => ({
  id: i.id,
  email: i.email,
  name: i.name,
  siteRole: i.siteRole,
  invitedBy: i.invitedBy.name,
  expiresAt: i.expiresAt.toISOString(),
  acceptedAt: i.acceptedAt?.toISOString() ?? null,
  createdAt: i.createdAt.toISOString(),
});
