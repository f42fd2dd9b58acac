import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { NewPasswordSchema, PASSWORD_MIN_LENGTH } from '@shared/api/auth';
import { Button } from '@client/components/ui/button';
import { FormAlert, TextField } from '@client/components/ui/form-field';
import { useResetPassword } from '../api/reset-password';
import { applyServerErrors } from '../api/field-errors';

const FormSchema = z
  .object({ password: NewPasswordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords are not the same.' });
type Values = z.infer<typeof FormSchema>;

export function ResetPasswordForm({ token, onDone }: { token: string; onDone: () => void }) {
  const [problem, setProblem] = useState<string | null>(null);
  const reset = useResetPassword();
  const form = useForm<Values>({ resolver: zodResolver(FormSchema), defaultValues: { password: '', repeat: '' } });
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async ({ password }) => {
    setProblem(null);
    try {
      await reset.mutateAsync({ token, password });
      onDone();
    } catch (err) {
      setProblem(applyServerErrors(err, ['password'], form.setError));
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Choose a new password">
      {problem && <FormAlert>{problem}</FormAlert>}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_LENGTH} characters. A short sentence is easy to remember and hard to guess.`}
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField label="New password again" type="password" autoComplete="new-password" error={errors.repeat?.message} {...form.register('repeat')} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? 'Saving…' : 'Save the new password'}
      </Button>
    </form>
  );
}
