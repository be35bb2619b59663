import { ResetSchema } from '../../lib/schemas/auth';
import { Field, FormMessage } from './Field';
import { QueryRoot } from './QueryRoot';
import { useApiForm } from './use-api-form';

function Reset({ token }: { token: string }) {
  const { form, mutation, onSubmit } = useApiForm({ schema: ResetSchema, path: '/api/auth/reset', defaultValues: { token } });
  if (mutation.isSuccess) {
    return (
      <FormMessage kind="good">
        Your password is changed and every session was signed out. <a href="/sign-in">Sign in with the new password</a>.
      </FormMessage>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Choose a new password">
      {mutation.error && !mutation.error.fields && <FormMessage kind="bad">{mutation.error.message}</FormMessage>}
      {form.formState.errors.token && <FormMessage kind="bad">{form.formState.errors.token.message}</FormMessage>}
      <input type="hidden" {...form.register('token')} />
      <Field
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={form.formState.errors.password?.message}
        {...form.register('password')}
      />
      <button type="submit" className="btn btn-primary" disabled={mutation.isPending}>
        Set new password
      </button>
    </form>
  );
}

export default function ResetPasswordForm(props: { token: string }) {
  return (
    <QueryRoot>
      <Reset {...props} />
    </QueryRoot>
  );
}
