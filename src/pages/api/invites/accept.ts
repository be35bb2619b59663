import { AcceptInviteSchema } from '../../../lib/schemas/labs';
import { requireUser } from '../../../server/auth/guards';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { acceptInvite } from '../../../server/labs/labs';

export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { token } = await readJson(ctx.request, AcceptInviteSchema);
  const lab = await acceptInvite(user, token);
  return { lab: { id: lab.id, slug: lab.slug, name: lab.name } };
});
