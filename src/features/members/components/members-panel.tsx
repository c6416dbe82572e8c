import { useState } from 'react';
import { NOTEBOOK_ROLES, NOTEBOOK_ROLE_LABELS, type NotebookRole } from '@shared/domain/roles.ts';
import type { Member } from '@shared/api/notebooks.ts';
import { NotebookRoleBadge } from '@/components/ui/badge.tsx';
import { Button } from '@/components/ui/button.tsx';
import { ConfirmButton, Dialog, DialogActions } from '@/components/ui/dialog.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { Input, Select } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { ApiError } from '@/lib/api-error.ts';
import { addMemberSchema, useAddMember } from '../api/add-member.ts';
import { useChangeMemberRole } from '../api/change-member-role.ts';
import { useMembers } from '../api/get-members.ts';
import { useRemoveMember } from '../api/remove-member.ts';

const roleOptions = NOTEBOOK_ROLES.map((r) => ({ value: r, label: NOTEBOOK_ROLE_LABELS[r] }));

type Props = {
  notebookId: string;
  notebookTitle: string;
  /** Only a PI manages members. */ canManage: boolean;
  currentUserId: string;
};

export function MembersPanel({ notebookId, notebookTitle, canManage, currentUserId }: Props) {
  const members = useMembers(notebookId);
  return (
    <section aria-labelledby="members-heading" className="rounded-lg border border-rule bg-surface p-5">
      <div className="mb-4 flex items-center justify-between gap-3">
        <h2 id="members-heading" className="text-base font-semibold text-ink">
          Members
        </h2>
        {canManage && <AddMemberButton notebookId={notebookId} />}
      </div>
      {members.isPending && <SkeletonBlock lines={3} label="Loading members" />}
      {members.isError && (
        <QueryError error={members.error} what="the members" onRetry={() => void members.refetch()} />
      )}
      {members.isSuccess && (
        <ul className="divide-y divide-rule" aria-label={`Members of ${notebookTitle}`}>
          {members.data.map((m) => (
            <MemberRow
              key={m.userId}
              notebookId={notebookId}
              member={m}
              canManage={canManage}
              isSelf={m.userId === currentUserId}
            />
          ))}
        </ul>
      )}
      {!canManage && (
        <p className="mt-4 text-xs text-ink-muted">
          Only the principal investigator can add members or change their roles.
        </p>
      )}
    </section>
  );
}

function MemberRow({
  notebookId,
  member,
  canManage,
  isSelf,
}: {
  notebookId: string;
  member: Member;
  canManage: boolean;
  isSelf: boolean;
}) {
  const change = useChangeMemberRole(notebookId);
  const remove = useRemoveMember(notebookId);
  const fail = (e: unknown) => toast.error('Not changed', e instanceof ApiError ? e.message : undefined);
  return (
    <li className="flex flex-wrap items-center gap-x-3 gap-y-2 py-3">
      <div className="min-w-0 flex-1 basis-40">
        <p className="truncate text-sm font-medium text-ink">
          {member.name}
          {isSelf && <span className="text-ink-muted"> (you)</span>}
        </p>
        <p className="truncate text-xs text-ink-muted">{member.email}</p>
      </div>
      {canManage ? (
        <div className="flex w-full items-center gap-2">
          <label className="sr-only" htmlFor={`role-${member.userId}`}>
            Role of {member.name}
          </label>
          <Select
            id={`role-${member.userId}`}
            compact
            className="flex-1"
            value={member.role}
            disabled={change.isPending}
            options={roleOptions}
            onChange={(e) =>
              change.mutate(
                { userId: member.userId, role: e.target.value as NotebookRole },
                { onError: fail },
              )
            }
          />
          <ConfirmButton
            variant="quiet"
            label="Remove"
            accessibleLabel={`Remove ${member.name}`}
            title={`Remove ${member.name}?`}
            description="They will no longer see this notebook. Their past entries and signatures stay in the record."
            keepLabel="Keep"
            confirmLabel="Remove from notebook"
            busy={remove.isPending}
            onConfirm={(close) => remove.mutate(member.userId, { onSettled: close, onError: fail })}
          />
        </div>
      ) : (
        <NotebookRoleBadge role={member.role} />
      )}
    </li>
  );
}

function AddMemberButton({ notebookId }: { notebookId: string }) {
  const [open, setOpen] = useState(false);
  const form = useZodForm(addMemberSchema, { email: '', role: 'researcher' });
  const add = useAddMember(notebookId);
  const close = () => {
    setOpen(false);
    form.reset();
  };
  return (
    <>
      <Button size="sm" onClick={() => setOpen(true)}>
        Add member
      </Button>
      <Dialog
        open={open}
        onClose={close}
        title="Add a member"
        description="The person needs an account on this site. An administrator can invite new people."
      >
        <form
          noValidate
          className="space-y-4"
          onSubmit={form.handleSubmit((d) =>
            add.mutate(d, {
              onSuccess: (m) => {
                close();
                toast.success(`${m.name} added`);
              },
              onError: form.applyError,
            }),
          )}
        >
          <FormAlert>{form.formError}</FormAlert>
          <Field label="E-mail address" error={form.errors.email}>
            <Input type="email" autoFocus {...form.bind('email')} />
          </Field>
          <Field
            label="Role"
            help="Researchers write entries; readers read and comment; a principal investigator also reviews and manages members."
            error={form.errors.role}
          >
            <Select options={roleOptions} {...form.bind('role')} />
          </Field>
          <DialogActions onCancel={close} submitLabel="Add member" busy={add.isPending} />
        </form>
      </Dialog>
    </>
  );
}
