import { UpdateProfileSchema } from '../../lib/schemas/auth';
import { updateProfile } from '../../server/auth/accounts';
import { requireUser } from '../../server/auth/guards';
import { loadCurrentUser, publicUser } from '../../server/auth/users';
import { readJson } from '../../server/http/body';
import { endpoint } from '../../server/http/endpoint';

export const GET = endpoint(async (ctx) => ({ user: publicUser(requireUser(ctx)) }));

export const PATCH = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { name } = await readJson(ctx.request, UpdateProfileSchema);
  await updateProfile(user.id, name);
  const fresh = await loadCurrentUser(user.id);
  return { user: fresh && publicUser(fresh) };
});
