import { z } from 'zod';
import { passwordSchema } from '@shared/api/users.ts';
import { LIMITS } from '@shared/domain/limits.ts';
import { Field } from '@/components/ui/field.tsx';
import { Input } from '@/components/ui/input.tsx';

/** A new password typed twice; the shared password rules plus "both the same". */
export const newPasswordFormSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });

type Bind = (name: 'password' | 'confirm') => {
  name: string;
  value: string;
  onChange: (e: { target: { value: string } }) => void;
};

export function NewPasswordFields({ bind, errors }: { bind: Bind; errors: Record<string, string> }) {
  return (
    <>
      <Field
        label="New password"
        help={`At least ${LIMITS.passwordMin} characters. A short sentence works well.`}
        error={errors.password}
      >
        <Input type="password" autoComplete="new-password" {...bind('password')} />
      </Field>
      <Field label="Repeat the new password" error={errors.confirm}>
        <Input type="password" autoComplete="new-password" {...bind('confirm')} />
      </Field>
    </>
  );
}
