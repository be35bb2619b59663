import { useState } from 'react';
import { SignUpSchema } from '../../lib/schemas/auth';
import { Field, FormMessage } from './Field';
import { QueryRoot } from './QueryRoot';
import { useApiForm } from './use-api-form';

function SignUp() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { form, mutation, onSubmit } = useApiForm({
    schema: SignUpSchema,
    path: '/api/auth/sign-up',
    onSuccess: (_res, v) => setSentTo(v.email),
  });
  const { errors } = form.formState;
  if (sentTo) {
    return (
      <FormMessage kind="good">
        <p className="font-medium">Check your inbox.</p>
        <p>
          We sent a confirmation link to <strong>{sentTo}</strong>. Open it, then <a href="/sign-in">sign in</a>.
        </p>
      </FormMessage>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Create account">
      {mutation.error && !mutation.error.fields && <FormMessage kind="bad">{mutation.error.message}</FormMessage>}
      <Field label="Your name" autoComplete="name" error={errors.name?.message} {...form.register('name')} />
      <Field
        label="E-mail address"
        type="email"
        autoComplete="email"
        hint="Your lab or institute address helps sellers trust you."
        error={errors.email?.message}
        {...form.register('email')}
      />
      <Field
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <button type="submit" className="btn btn-primary" disabled={mutation.isPending}>
        {mutation.isPending ? 'Creating account…' : 'Create account'}
      </button>
    </form>
  );
}

export default function SignUpForm() {
  return (
    <QueryRoot>
      <SignUp />
    </QueryRoot>
  );
}
