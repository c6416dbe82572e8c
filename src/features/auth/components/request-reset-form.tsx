import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';
import { Button } from '@/components/ui/button.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { Input } from '@/components/ui/input.tsx';
import { requestResetSchema, useRequestPasswordReset } from '../api/request-password-reset.ts';

export function RequestResetForm() {
  const form = useZodForm(requestResetSchema, { email: '' });
  const request = useRequestPasswordReset();

  if (request.isSuccess) {
    return (
      <div className="space-y-4">
        <FormAlert tone="success">
          If {String(form.values.email)} belongs to an account, a message with a link to choose a new password
          is on its way. The link works for two hours.
        </FormAlert>
        <p className="text-sm">
          <Link to={paths.signIn.getHref()}>Back to sign-in</Link>
        </p>
      </div>
    );
  }

  return (
    <form
      onSubmit={form.handleSubmit((d) => request.mutate(d, { onError: form.applyError }))}
      noValidate
      className="space-y-4"
      aria-label="Request a password reset"
    >
      <FormAlert>{form.formError}</FormAlert>
      <Field label="E-mail address" help="We will send a link to this address." error={form.errors.email}>
        <Input type="email" autoComplete="email" autoFocus {...form.bind('email')} />
      </Field>
      <Button type="submit" className="w-full" busy={request.isPending}>
        Send the link
      </Button>
      <p className="text-center text-sm">
        <Link to={paths.signIn.getHref()}>Back to sign-in</Link>
      </p>
    </form>
  );
}
