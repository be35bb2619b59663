import { endSession } from '../../../server/auth/session';
import { endpoint } from '../../../server/http/endpoint';

export const POST = endpoint(async ({ cookies, locals }) => {
  await endSession(cookies, locals.session?.id);
  return { ok: true };
});
