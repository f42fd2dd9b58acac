import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { AcceptInvitationRequestSchema, PASSWORD_MIN_LENGTH, type Me } from '@shared/api/auth';
import { Button } from '@client/components/ui/button';
import { FormAlert, TextField } from '@client/components/ui/form-field';
import { useAcceptInvitation } from '../api/invitation';
import { applyServerErrors } from '../api/field-errors';

const FormSchema = AcceptInvitationRequestSchema.extend({ repeat: z.string() }).refine((v) => v.password === v.repeat, {
  path: ['repeat'],
  message: 'The two passwords are not the same.',
});
type Input = z.input<typeof FormSchema>;
type Output = z.output<typeof FormSchema>;

export function AcceptInvitationForm({ token, onAccepted }: { token: string; onAccepted: (user: Me) => void }) {
  const [problem, setProblem] = useState<string | null>(null);
  const accept = useAcceptInvitation();
  const form = useForm<Input, unknown, Output>({ resolver: zodResolver(FormSchema), defaultValues: { name: '', password: '', repeat: '' } });
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async ({ name, password }) => {
    setProblem(null);
    try {
      const session = await accept.mutateAsync({ token, name, password });
      onAccepted(session.user);
    } catch (err) {
      setProblem(applyServerErrors(err, ['name', 'password'], form.setError));
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Accept the invitation">
      {problem && <FormAlert>{problem}</FormAlert>}
      <TextField label="Your name" autoComplete="name" hint="As your colleagues know you; it appears on surveys and reviews." error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="Choose a password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_LENGTH} characters. A short sentence is easy to remember and hard to guess.`}
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField label="The password again" type="password" autoComplete="new-password" error={errors.repeat?.message} {...form.register('repeat')} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? 'Joining…' : 'Join and sign in'}
      </Button>
    </form>
  );
}
