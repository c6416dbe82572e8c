import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';
import { Button } from '@/components/ui/button.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { isApiError } from '@/lib/api-error.ts';
import { useCompletePasswordReset } from '../api/complete-password-reset.ts';
import { NewPasswordFields, newPasswordFormSchema } from './password-fields.tsx';

export function CompleteResetForm({ token }: { token: string }) {
  const form = useZodForm(newPasswordFormSchema, { password: '', confirm: '' });
  const complete = useCompletePasswordReset();

  if (complete.isSuccess) {
    return (
      <div className="space-y-4">
        <FormAlert tone="success">Your password has been changed. Sign in with the new one.</FormAlert>
        <Link to={paths.signIn.getHref()} className="text-sm">
          Go to sign-in
        </Link>
      </div>
    );
  }

  const submit = form.handleSubmit(({ password }) =>
    complete.mutate(
      { token, password },
      {
        onError: (e) => {
          if (isApiError(e) && e.status === 400 && !e.fieldMessage('password'))
            form.setFormError('This link has expired or has already been used. Ask for a new one.');
          else form.applyError(e);
        },
      },
    ),
  );

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Choose a new password">
      <FormAlert>{form.formError}</FormAlert>
      {form.formError && (
        <p className="text-sm">
          <Link to={paths.requestReset.getHref()}>Ask for a new link</Link>
        </p>
      )}
      <NewPasswordFields bind={form.bind} errors={form.errors} />
      <Button type="submit" className="w-full" busy={complete.isPending}>
        Set the new password
      </Button>
    </form>
  );
}
