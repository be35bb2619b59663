import { useState } from 'react';
import { ResetRequestSchema } from '../../lib/schemas/auth';
import { Field, FormMessage } from './Field';
import { QueryRoot } from './QueryRoot';
import { useApiForm } from './use-api-form';

function Forgot() {
  const [done, setDone] = useState(false);
  const { form, mutation, onSubmit } = useApiForm({
    schema: ResetRequestSchema,
    path: '/api/auth/reset-request',
    onSuccess: () => setDone(true),
  });
  if (done) {
    return (
      <FormMessage kind="good">
        If an account uses this address, a reset link is on its way. It works once and expires in 1 hour.
      </FormMessage>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Ask for a reset link">
      {mutation.error && !mutation.error.fields && <FormMessage kind="bad">{mutation.error.message}</FormMessage>}
      <Field
        label="E-mail address"
        type="email"
        autoComplete="email"
        error={form.formState.errors.email?.message}
        {...form.register('email')}
      />
      <button type="submit" className="btn btn-primary" disabled={mutation.isPending}>
        Send reset link
      </button>
    </form>
  );
}

export default function ForgotPasswordForm() {
  return (
    <QueryRoot>
      <Forgot />
    </QueryRoot>
  );
}
