import type { MeResponse } from '@shared/api/auth.ts';
import type { MembershipEntity } from '@server/entities/membership.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { presentUser } from './user.presenter.ts';

export const presentMe = (user: UserEntity, memberships: MembershipEntity[]): MeResponse => ({
  user: presentUser(user),
  memberships: memberships.map((m) => ({ notebookId: m.notebookId, role: m.role })),
});
