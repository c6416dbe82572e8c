import { SITE_ROLES, SITE_ROLE_LABELS, type SiteRole } from '@shared/domain/roles.ts';
import type { User } from '@shared/api/users.ts';
import { ActiveBadge } from '@/components/ui/badge.tsx';
import { Button } from '@/components/ui/button.tsx';
import { ConfirmButton } from '@/components/ui/dialog.tsx';
import { Select } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { DataTable, type Column } from '@/components/ui/table.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { ApiError } from '@/lib/api-error.ts';
import { formatDate } from '@/lib/format.ts';
import { useUsers } from '../api/get-users.ts';
import { useUpdateUser } from '../api/update-user.ts';

const siteRoleOptions = SITE_ROLES.map((r) => ({ value: r, label: SITE_ROLE_LABELS[r] }));

const fail = (e: unknown) => toast.error('Not changed', e instanceof ApiError ? e.message : undefined);

function SiteRoleSelect({ user, disabled }: { user: User; disabled: boolean }) {
  const update = useUpdateUser();
  return (
    <Select
      aria-label={`Site role of ${user.name}`}
      compact
      value={user.siteRole}
      disabled={disabled || update.isPending}
      onChange={(e) =>
        update.mutate(
          { id: user.id, siteRole: e.target.value as SiteRole },
          {
            onSuccess: (u) => toast.success(`${u.name} is now ${SITE_ROLE_LABELS[u.siteRole].toLowerCase()}`),
            onError: fail,
          },
        )
      }

      options={siteRoleOptions}
    />
  );
}

function ActiveToggle({ user, disabled }: { user: User; disabled: boolean }) {
  const update = useUpdateUser();
  if (!user.active)
    return (
      <Button
        size="sm"
        variant="secondary"
        disabled={disabled}
        busy={update.isPending}
        onClick={() => update.mutate({ id: user.id, active: true }, { onError: fail })}
      >
        Reactivate
      </Button>
    );
  return (
    <ConfirmButton
      label="Deactivate"
      accessibleLabel={`Deactivate ${user.name}`}
      disabled={disabled}
      title={`Deactivate ${user.name}?`}
      description="They can no longer sign in. Their entries, revisions and signatures stay in the record, and you can reactivate them later."
      keepLabel="Keep active"
      confirmLabel="Deactivate"
      busy={update.isPending}
      onConfirm={(close) =>
        update.mutate({ id: user.id, active: false }, { onSettled: close, onError: fail })
      }
    />
  );
}

export function UsersTable({ currentUserId }: { currentUserId: string }) {
  const users = useUsers();
  if (users.isPending) return <SkeletonBlock lines={6} label="Loading people" />;
  if (users.isError)
    return <QueryError error={users.error} what="the people" onRetry={() => void users.refetch()} />;
  const columns: Column<User>[] = [
    {
      key: 'name',
      header: 'Name',
      sortValue: (u) => u.name,
      cell: (u) => (
        <span className="font-medium">
          {u.name}
          {u.id === currentUserId && <span className="text-ink-muted"> (you)</span>}
        </span>
      ),
    },
    {
      key: 'email',
      header: 'E-mail',
      sortValue: (u) => u.email,
      cell: (u) => <span className="text-ink-muted">{u.email}</span>,
    },
    {
      key: 'siteRole',
      header: 'Site role',
      sortValue: (u) => u.siteRole,
      cell: (u) => <SiteRoleSelect user={u} disabled={u.id === currentUserId} />,
    },
    {
      key: 'active',
      header: 'Status',
      sortValue: (u) => (u.active ? 0 : 1),
      cell: (u) => <ActiveBadge active={u.active} />,
    },
    {
      key: 'createdAt',
      header: 'Joined',
      sortValue: (u) => u.createdAt,
      cell: (u) => <span className="figures text-xs">{formatDate(u.createdAt)}</span>,
    },
    {
      key: 'actions',
      header: 'Actions',
      cell: (u) => <ActiveToggle user={u} disabled={u.id === currentUserId} />,
    },
  ];
  return (
    <DataTable
      caption="People with an account"
      columns={columns}
      rows={users.data}
      rowKey={(u) => u.id}
      initialSort={{ key: 'name', direction: 'ascending' }}
      pageSize={10}
    />
  );
}
