import { resendVerification } from '../../../server/auth/accounts';
import { requireUser } from '../../../server/auth/guards';
import { endpoint } from '../../../server/http/endpoint';
import { jsonResponse } from '../../../server/http/errors';

export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  await resendVerification(user.id);
  return jsonResponse({ ok: true }, 202);
});
