import { z } from 'zod';
import { personNameSchema } from '@shared/api/users.ts';
import { Button } from '@/components/ui/button.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { Input } from '@/components/ui/input.tsx';
import { useAcceptInvite } from '../api/accept-invite.ts';
import { NewPasswordFields, newPasswordFormSchema } from './password-fields.tsx';

const acceptFormSchema = z.intersection(z.object({ name: personNameSchema }), newPasswordFormSchema);

export function AcceptInviteForm({
  token,
  email,
  name,
  onSuccess,
}: {
  token: string;
  email: string;
  name: string;
  onSuccess: () => void;
}) {
  const form = useZodForm(acceptFormSchema, { name, password: '', confirm: '' });
  const accept = useAcceptInvite();
  const submit = form.handleSubmit((d) =>
    accept.mutate({ token, name: d.name, password: d.password }, { onSuccess, onError: form.applyError }),
  );

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Set up your account">
      <FormAlert>{form.formError}</FormAlert>
      <Field label="E-mail address" help="Your invite was sent here; it is your sign-in name.">
        <Input type="email" value={email} readOnly autoComplete="username" />
      </Field>
      <Field
        label="Your name"
        help="As colleagues will see it on entries and signatures."
        error={form.errors.name}
      >
        <Input autoComplete="name" {...form.bind('name')} />
      </Field>
      <NewPasswordFields bind={form.bind} errors={form.errors} />
      <Button type="submit" className="w-full" busy={accept.isPending}>
        Create my account
      </Button>
    </form>
  );
}
