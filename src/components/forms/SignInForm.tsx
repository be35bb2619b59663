import { SignInSchema } from '../../lib/schemas/auth';
import { safeNext } from '../../lib/safe-next';
import { Field, FormMessage } from './Field';
import { QueryRoot } from './QueryRoot';
import { useApiForm } from './use-api-form';

function SignIn({ next }: { next?: string }) {
  const { form, mutation, onSubmit } = useApiForm({
    schema: SignInSchema,
    path: '/api/auth/sign-in',
    onSuccess: () => window.location.assign(safeNext(next)),
  });
  const { errors } = form.formState;
  const err = mutation.error;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sign in">
      {err && !err.fields && (
        <FormMessage kind="bad">
          {err.message}
          {err.status === 429 && (
            <>
              {' '}
              <a href="/forgot-password">Reset your password</a>
            </>
          )}
        </FormMessage>
      )}
      <Field label="E-mail address" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <Field
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...form.register('password')}
      />
      <div className="flex flex-wrap items-center gap-4">
        <button type="submit" className="btn btn-primary" disabled={mutation.isPending || mutation.isSuccess}>
          {mutation.isPending || mutation.isSuccess ? 'Signing in…' : 'Sign in'}
        </button>
        <a href="/forgot-password" className="text-sm">
          Forgot your password?
        </a>
      </div>
    </form>
  );
}

export default function SignInForm(props: { next?: string }) {
  return (
    <QueryRoot>
      <SignIn {...props} />
    </QueryRoot>
  );
}
