import { useMutation } from '@tanstack/react-query';
import { api, type ApiError } from '../../lib/api-client';
import { InviteSchema } from '../../lib/schemas/labs';
import { Field, FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';
import { useApiForm } from '../forms/use-api-form';

function Invite({ labSlug }: { labSlug: string }) {
  const { form, mutation, onSubmit } = useApiForm<{ email: string }, { email: string }, { invite: { email: string } }>({
    schema: InviteSchema,
    path: `/api/labs/${labSlug}/invites`,
    onSuccess: () => form.reset({ email: '' }),
  });
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Invite a member">
      {mutation.isSuccess && (
        <FormMessage kind="good">Invitation sent to {mutation.data.invite.email}. Reload to see it below.</FormMessage>
      )}
      {mutation.error && !mutation.error.fields && <FormMessage kind="bad">{mutation.error.message}</FormMessage>}
      <Field label="Colleague's e-mail address" type="email" error={form.formState.errors.email?.message} {...form.register('email')} />
      <button type="submit" className="btn btn-primary" disabled={mutation.isPending}>
        Send invitation
      </button>
    </form>
  );
}

export function LabInviteForm(props: { labSlug: string }) {
  return (
    <QueryRoot>
      <Invite {...props} />
    </QueryRoot>
  );
}

function Remove({ labSlug, userId, name }: { labSlug: string; userId: string; name: string }) {
  const m = useMutation<unknown, ApiError>({
    mutationFn: () => api(`/api/labs/${labSlug}/members/${userId}`, { method: 'DELETE' }),
    onSuccess: () => window.location.reload(),
  });
  return (
    <span>
      <button
        type="button"
        className="text-sm text-bad underline"
        onClick={() => {
          if (window.confirm(`Remove ${name} from the lab?`)) m.mutate();
        }}
        disabled={m.isPending}
      >
        Remove
      </button>
      {m.error && (
        <span role="alert" className="field-error block">
          {m.error.message}
        </span>
      )}
    </span>
  );
}

export function RemoveMemberButton(props: { labSlug: string; userId: string; name: string }) {
  return (
    <QueryRoot>
      <Remove {...props} />
    </QueryRoot>
  );
}

function Accept({ token }: { token: string }) {
  const m = useMutation<{ lab: { slug: string; name: string } }, ApiError>({
    mutationFn: () => api('/api/invites/accept', { body: { token } }),
    onSuccess: (res) => window.location.assign(`/labs/${res.lab.slug}`),
  });
  return (
    <div>
      {m.error && <FormMessage kind="bad">{m.error.message}</FormMessage>}
      <button type="button" className="btn btn-primary" onClick={() => m.mutate()} disabled={m.isPending || m.isSuccess}>
        Join the lab
      </button>
    </div>
  );
}

export function AcceptInvite(props: { token: string }) {
  return (
    <QueryRoot>
      <Accept {...props} />
    </QueryRoot>
  );
}
