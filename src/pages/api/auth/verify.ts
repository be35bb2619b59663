import { VerifySchema } from '../../../lib/schemas/auth';
import { verifyEmail } from '../../../server/auth/accounts';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';

export const POST = endpoint(async ({ request }) => {
  const { token } = await readJson(request, VerifySchema);
  await verifyEmail(token);
  return { ok: true, next: 'Your e-mail address is confirmed.' };
});
