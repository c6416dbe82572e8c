import { SITE_ROLES, SITE_ROLE_LABELS } from '@shared/domain/roles.ts';
import { LIMITS } from '@shared/domain/limits.ts';
import { Button } from '@/components/ui/button.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { Input, Select } from '@/components/ui/input.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { createInviteSchema, useCreateInvite } from '../api/create-invite.ts';

const siteRoleOptions = SITE_ROLES.map((r) => ({ value: r, label: SITE_ROLE_LABELS[r] }));

export function InviteForm({ onDone }: { onDone?: () => void }) {
  const form = useZodForm(createInviteSchema, { email: '', name: '', siteRole: 'member' });
  const create = useCreateInvite();
  return (
    <form
      noValidate
      className="space-y-4"
      aria-label="Invite someone"
      onSubmit={form.handleSubmit((d) =>
        create.mutate(d, {
          onSuccess: (inv) => {
            toast.success('Invite sent', `${inv.email} has ${LIMITS.inviteTtlHours} hours to accept.`);
            form.reset();
            onDone?.();
          },
          onError: form.applyError,
        }),
      )}
    >
      <FormAlert>{form.formError}</FormAlert>
      <Field label="Name" error={form.errors.name}>
        <Input autoComplete="off" {...form.bind('name')} />
      </Field>
      <Field label="E-mail address" help="The invite link is sent here." error={form.errors.email}>
        <Input type="email" autoComplete="off" {...form.bind('email')} />
      </Field>
      <Field
        label="Site role"
        help="Administrators manage accounts; everyone else is a member."
        error={form.errors.siteRole}
      >
        <Select {...form.bind('siteRole')} options={siteRoleOptions} />
      </Field>
      <Button type="submit" busy={create.isPending}>
        Send invite
      </Button>
    </form>
  );
}
