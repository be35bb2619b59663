import { ChangePasswordSchema } from '../../../lib/schemas/auth';
import { changePassword } from '../../../server/auth/accounts';
import { requireUser } from '../../../server/auth/guards';
import { endAllSessions, startSession } from '../../../server/auth/session';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';

/** Every other session ends and this one is replaced by a new id. */
export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { currentPassword, newPassword } = await readJson(ctx.request, ChangePasswordSchema);
  await changePassword(user.id, currentPassword, newPassword);
  await endAllSessions(user.id);
  await startSession(ctx.cookies, user.id);
  return { ok: true };
});
