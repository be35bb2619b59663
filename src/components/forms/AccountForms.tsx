import { useMutation } from '@tanstack/react-query';
import { api, type ApiError } from '../../lib/api-client';
import { ChangePasswordSchema, UpdateProfileSchema } from '../../lib/schemas/auth';
import { CreateLabSchema } from '../../lib/schemas/labs';
import { Field, FormMessage } from './Field';
import { QueryRoot } from './QueryRoot';
import { useApiForm } from './use-api-form';

function Profile({ name }: { name: string }) {
  const { form, mutation, onSubmit } = useApiForm({
    schema: UpdateProfileSchema,
    path: '/api/me',
    method: 'PATCH',
    defaultValues: { name },
  });
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Profile">
      {mutation.isSuccess && <FormMessage kind="good">Saved.</FormMessage>}
      {mutation.error && !mutation.error.fields && <FormMessage kind="bad">{mutation.error.message}</FormMessage>}
      <Field label="Display name" autoComplete="name" error={form.formState.errors.name?.message} {...form.register('name')} />
      <button type="submit" className="btn btn-quiet" disabled={mutation.isPending}>
        Save name
      </button>
    </form>
  );
}

function ChangePassword() {
  const { form, mutation, onSubmit } = useApiForm({
    schema: ChangePasswordSchema,
    path: '/api/auth/change-password',
    onSuccess: () => form.reset({ currentPassword: '', newPassword: '' }),
  });
  const { errors } = form.formState;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Change password">
      {mutation.isSuccess && <FormMessage kind="good">Password changed. Your other sessions were signed out.</FormMessage>}
      {mutation.error && !mutation.error.fields && <FormMessage kind="bad">{mutation.error.message}</FormMessage>}
      <Field
        label="Current password"
        type="password"
        autoComplete="current-password"
        error={errors.currentPassword?.message}
        {...form.register('currentPassword')}
      />
      <Field
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={errors.newPassword?.message}
        {...form.register('newPassword')}
      />
      <button type="submit" className="btn btn-quiet" disabled={mutation.isPending}>
        Change password
      </button>
    </form>
  );
}

function Resend() {
  const m = useMutation<unknown, ApiError>({ mutationFn: () => api('/api/auth/resend-verification', { body: {} }) });
  return (
    <div>
      {m.isSuccess && <FormMessage kind="good">A new confirmation link is on its way.</FormMessage>}
      {m.error && <FormMessage kind="bad">{m.error.message}</FormMessage>}
      <button type="button" className="btn btn-quiet" onClick={() => m.mutate()} disabled={m.isPending || m.isSuccess}>
        Send the confirmation link again
      </button>
    </div>
  );
}

function CreateLab() {
  const { form, mutation, onSubmit } = useApiForm<
    { name: string; institute: string; country: string },
    { name: string; institute: string; country: string },
    { lab: { slug: string } }
  >({
    schema: CreateLabSchema,
    path: '/api/labs',
    onSuccess: (res) => window.location.assign(`/labs/${res.lab.slug}`),
  });
  const { errors } = form.formState;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Create a lab">
      {mutation.error && !mutation.error.fields && <FormMessage kind="bad">{mutation.error.message}</FormMessage>}
      <Field label="Lab name" error={errors.name?.message} {...form.register('name')} />
      <Field label="Institute" error={errors.institute?.message} {...form.register('institute')} />
      <Field
        label="Country"
        hint="Two-letter code, e.g. DE, US, JP."
        maxLength={2}
        className="field-input w-24 uppercase"
        error={errors.country?.message}
        {...form.register('country')}
      />
      <button type="submit" className="btn btn-primary" disabled={mutation.isPending}>
        Create lab
      </button>
    </form>
  );
}

export function ProfileForm(props: { name: string }) {
  return (
    <QueryRoot>
      <Profile {...props} />
    </QueryRoot>
  );
}
export function ChangePasswordForm() {
  return (
    <QueryRoot>
      <ChangePassword />
    </QueryRoot>
  );
}
export function ResendVerification() {
  return (
    <QueryRoot>
      <Resend />
    </QueryRoot>
  );
}
export function CreateLabForm() {
  return (
    <QueryRoot>
      <CreateLab />
    </QueryRoot>
  );
}
