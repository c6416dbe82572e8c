import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';
import { Button } from '@/components/ui/button.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { Input } from '@/components/ui/input.tsx';
import { isApiError } from '@/lib/api-error.ts';
import { signInSchema, useSignIn } from '../api/sign-in.ts';

export function SignInForm({ onSuccess }: { onSuccess: () => void }) {
  const form = useZodForm(signInSchema, { email: '', password: '' });
  const signIn = useSignIn();

  const submit = form.handleSubmit((data) =>
    signIn.mutate(data, {
      onSuccess,
      onError: (e) => {
        if (isApiError(e) && e.status === 401)
          form.setFormError('That e-mail address and password do not match an active account.');
        else form.applyError(e);
      },
    }),
  );

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Sign in">
      <FormAlert>{form.formError}</FormAlert>
      <Field label="E-mail address" error={form.errors.email}>
        <Input type="email" autoComplete="username" inputMode="email" autoFocus {...form.bind('email')} />
      </Field>
      <Field label="Password" error={form.errors.password}>
        <Input type="password" autoComplete="current-password" {...form.bind('password')} />
      </Field>
      <Button type="submit" className="w-full" busy={signIn.isPending}>
        Sign in
      </Button>
      <p className="text-center text-sm">
        <Link to={paths.requestReset.getHref()}>Forgotten your password?</Link>
      </p>
    </form>
  );
}
