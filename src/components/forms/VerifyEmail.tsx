import { useMutation } from '@tanstack/react-query';
import { api, type ApiError } from '../../lib/api-client';
import { FormMessage } from './Field';
import { QueryRoot } from './QueryRoot';

/** Confirmation needs a click: mail scanners that prefetch links must not confirm an address. */
function Verify({ token, signedIn }: { token: string; signedIn: boolean }) {
  const m = useMutation<unknown, ApiError>({ mutationFn: () => api('/api/auth/verify', { body: { token } }) });
  if (m.isSuccess) {
    return (
      <FormMessage kind="good">
        <p className="font-medium">Your e-mail address is confirmed.</p>
        <p>{signedIn ? <a href="/account">Go to your account</a> : <a href="/sign-in">Sign in to continue</a>}</p>
      </FormMessage>
    );
  }
  return (
    <div>
      {m.error && <FormMessage kind="bad">{m.error.message}</FormMessage>}
      <button type="button" className="btn btn-primary" onClick={() => m.mutate()} disabled={m.isPending}>
        {m.isPending ? 'Confirming…' : 'Confirm my e-mail address'}
      </button>
    </div>
  );
}

export default function VerifyEmail(props: { token: string; signedIn: boolean }) {
  return (
    <QueryRoot>
      <Verify {...props} />
    </QueryRoot>
  );
}
