import type { Invite } from '@shared/api/auth.ts';
import { Badge, SiteRoleBadge, type BadgeTone } from '@/components/ui/badge.tsx';
import { EmptyState } from '@/components/ui/empty-state.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { DataTable, type Column } from '@/components/ui/table.tsx';
import { formatDateTime } from '@/lib/format.ts';
import { useInvites } from '../api/get-invites.ts';

export type InviteStatus = 'accepted' | 'pending' | 'expired';

export function inviteStatus(
  invite: Pick<Invite, 'acceptedAt' | 'expiresAt'>,
  now = Date.now(),
): InviteStatus {
  if (invite.acceptedAt) return 'accepted';
  return new Date(invite.expiresAt).getTime() <= now ? 'expired' : 'pending';
}

const statusTone: Record<InviteStatus, BadgeTone> = {
  accepted: 'success',
  pending: 'warning',
  expired: 'neutral',
};
const statusLabel: Record<InviteStatus, string> = {
  accepted: 'Accepted',
  pending: 'Waiting',
  expired: 'Expired',
};

export function InvitesTable() {
  const invites = useInvites();
  if (invites.isPending) return <SkeletonBlock lines={4} label="Loading invites" />;
  if (invites.isError)
    return <QueryError error={invites.error} what="the invites" onRetry={() => void invites.refetch()} />;
  const columns: Column<Invite>[] = [
    {
      key: 'name',
      header: 'Name',
      sortValue: (i) => i.name,
      cell: (i) => <span className="font-medium">{i.name}</span>,
    },
    { key: 'email', header: 'E-mail', sortValue: (i) => i.email, cell: (i) => i.email },
    {
      key: 'siteRole',
      header: 'Site role',
      sortValue: (i) => i.siteRole,
      cell: (i) => <SiteRoleBadge role={i.siteRole} />,
    },
    {
      key: 'status',
      header: 'Status',
      sortValue: (i) => inviteStatus(i),
      cell: (i) => <Badge tone={statusTone[inviteStatus(i)]}>{statusLabel[inviteStatus(i)]}</Badge>,
    },
    { key: 'invitedBy', header: 'Invited by', sortValue: (i) => i.invitedBy, cell: (i) => i.invitedBy },
    {
      key: 'createdAt',
      header: 'Sent',
      sortValue: (i) => i.createdAt,
      cell: (i) => <span className="figures text-xs">{formatDateTime(i.createdAt)}</span>,
    },
  ];
  return (
    <DataTable
      caption="Invites"
      columns={columns}
      rows={invites.data}
      rowKey={(i) => i.id}
      initialSort={{ key: 'createdAt', direction: 'descending' }}
      empty={
        <EmptyState title="No invites sent">
          Invite colleagues by e-mail; each gets a link to choose a password and join.
        </EmptyState>
      }
    />
  );
}
