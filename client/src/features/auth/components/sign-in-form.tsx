import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { SignInRequestSchema, type Me } from '@shared/api/auth';
import { ApiError } from '@client/lib/api-client';
import { Button } from '@client/components/ui/button';
import { FormAlert, TextField } from '@client/components/ui/form-field';
import { useSignIn } from '../api/sign-in';
import { applyServerErrors } from '../api/field-errors';

type Input = z.input<typeof SignInRequestSchema>;
type Output = z.output<typeof SignInRequestSchema>;

export function SignInForm({ defaultEmail = '', onSignedIn }: { defaultEmail?: string; onSignedIn: (user: Me) => void }) {
  const [problem, setProblem] = useState<string | null>(null);
  const signIn = useSignIn();
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(SignInRequestSchema),
    defaultValues: { email: defaultEmail, password: '' },
  });
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    try {
      const session = await signIn.mutateAsync(values);
      onSignedIn(session.user);
    } catch (err) {
      if (err instanceof ApiError && err.status === 429) setProblem(err.message);
      else if (err instanceof ApiError && err.status === 401) {
        // A wrong e-mail or password: said at the password field (aria-describedby), where focus goes to retype it.
        form.setError('password', { type: 'server', message: err.message }, { shouldFocus: true });
      } else setProblem(applyServerErrors(err, ['email', 'password'], form.setError));
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Sign in">
      {problem && <FormAlert>{problem}</FormAlert>}
      <TextField label="E-mail" type="email" autoComplete="username" inputMode="email" error={errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
