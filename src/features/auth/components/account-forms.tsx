import { z } from 'zod';
import type { User } from '@shared/api/users.ts';
import { passwordSchema } from '@shared/api/users.ts';
import { Button } from '@/components/ui/button.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { Input } from '@/components/ui/input.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { changePasswordSchema, useChangePassword } from '../api/change-password.ts';
import { updateAccountSchema, useUpdateAccount } from '../api/update-account.ts';

export function AccountNameForm({ user }: { user: User }) {
  const form = useZodForm(updateAccountSchema, { name: user.name });
  const update = useUpdateAccount();
  return (
    <form
      onSubmit={form.handleSubmit((d) =>
        update.mutate(d, { onSuccess: () => toast.success('Name saved'), onError: form.applyError }),
      )}
      noValidate
      className="space-y-4"
      aria-label="Your name"
    >
      <FormAlert>{form.formError}</FormAlert>
      <Field label="Name" help="Shown on your entries, comments and signatures." error={form.errors.name}>
        <Input autoComplete="name" {...form.bind('name')} />
      </Field>
      <Field label="E-mail address" help="Ask an administrator to change it.">
        <Input type="email" value={user.email} readOnly />
      </Field>
      <Button type="submit" busy={update.isPending}>
        Save name
      </Button>
    </form>
  );
}

const changePasswordFormSchema = changePasswordSchema
  .extend({
    currentPassword: z.string().min(1, { message: 'Enter your current password' }),
    newPassword: passwordSchema,
    confirm: z.string(),
  })
  .refine((v) => v.newPassword === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });

export function ChangePasswordForm() {
  const form = useZodForm(changePasswordFormSchema, { currentPassword: '', newPassword: '', confirm: '' });
  const change = useChangePassword();
  const submit = form.handleSubmit(({ currentPassword, newPassword }) =>
    change.mutate(
      { currentPassword, newPassword },
      {
        onSuccess: () => {
          form.reset();
          toast.success('Password changed');
        },
        onError: form.applyError,
      },
    ),
  );
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Change password">
      <FormAlert>{form.formError}</FormAlert>
      <Field label="Current password" error={form.errors.currentPassword}>
        <Input type="password" autoComplete="current-password" {...form.bind('currentPassword')} />
      </Field>
      <Field label="New password" help="At least 10 characters." error={form.errors.newPassword}>
        <Input type="password" autoComplete="new-password" {...form.bind('newPassword')} />
      </Field>
      <Field label="Repeat the new password" error={form.errors.confirm}>
        <Input type="password" autoComplete="new-password" {...form.bind('confirm')} />
      </Field>
      <Button type="submit" busy={change.isPending}>
        Change password
      </Button>
    </form>
  );
}
