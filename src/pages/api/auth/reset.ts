import { ResetSchema } from '../../../lib/schemas/auth';
import { resetPassword } from '../../../server/auth/accounts';
import { endAllSessions } from '../../../server/auth/session';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';

export const POST = endpoint(async ({ request }) => {
  const { token, password } = await readJson(request, ResetSchema);
  const { userId } = await resetPassword(token, password);
  await endAllSessions(userId);
  return { ok: true, next: 'Your password is changed. Sign in with the new one.' };
});
