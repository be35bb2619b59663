import { ResetRequestSchema } from '../../../lib/schemas/auth';
import { requestPasswordReset } from '../../../server/auth/accounts';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { jsonResponse } from '../../../server/http/errors';

export const POST = endpoint(async ({ request }) => {
  const { email } = await readJson(request, ResetRequestSchema);
  await requestPasswordReset(email);
  return jsonResponse({ ok: true, next: 'If an account uses this address, a reset link is on its way. It expires in 1 hour.' }, 202);
});
