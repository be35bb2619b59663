import { SignInSchema } from '../../../lib/schemas/auth';
import { signIn } from '../../../server/auth/accounts';
import { startSession } from '../../../server/auth/session';
import { loadCurrentUser, publicUser } from '../../../server/auth/users';
import { readJson } from '../../../server/http/body';
import { clientAddress } from '../../../server/http/client-address';
import { endpoint } from '../../../server/http/endpoint';

export const POST = endpoint(async (ctx) => {
  const { email, password } = await readJson(ctx.request, SignInSchema);
  const { userId } = await signIn(email, password, clientAddress(ctx));
  await startSession(ctx.cookies, userId);
  const user = await loadCurrentUser(userId);
  return { user: user && publicUser(user) };
});
