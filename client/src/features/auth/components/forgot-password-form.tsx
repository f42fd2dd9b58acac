import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { ForgotPasswordRequestSchema } from '@shared/api/auth';
import { ApiError } from '@client/lib/api-client';
import { Button } from '@client/components/ui/button';
import { FormAlert, TextField } from '@client/components/ui/form-field';
import { useForgotPassword } from '../api/forgot-password';
import { applyServerErrors } from '../api/field-errors';

type Input = z.input<typeof ForgotPasswordRequestSchema>;
type Output = z.output<typeof ForgotPasswordRequestSchema>;

export function ForgotPasswordForm() {
  const [problem, setProblem] = useState<string | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const ask = useForgotPassword();
  const form = useForm<Input, unknown, Output>({ resolver: zodResolver(ForgotPasswordRequestSchema), defaultValues: { email: '' } });
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    try {
      setSent((await ask.mutateAsync(values)).message);
    } catch (err) {
      setProblem(err instanceof ApiError && err.status === 429 ? err.message : applyServerErrors(err, ['email'], form.setError));
    }
  });

  if (sent) return <FormAlert tone="ok">{sent}</FormAlert>;
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Ask for a new password">
      {problem && <FormAlert>{problem}</FormAlert>}
      <TextField label="E-mail" type="email" autoComplete="username" inputMode="email" error={errors.email?.message} {...form.register('email')} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? 'Sending…' : 'Send me a link'}
      </Button>
    </form>
  );
}
