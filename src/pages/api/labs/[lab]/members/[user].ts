import { requireLabMember } from '../../../../../server/auth/guards';
import { endpoint } from '../../../../../server/http/endpoint';
import { removeMember } from '../../../../../server/labs/labs';

export const DELETE = endpoint(async (ctx) => {
  const { user, lab } = await requireLabMember(ctx, ctx.params.lab!, { owner: true });
  await removeMember(user, lab.id, ctx.params.user!);
  return { ok: true };
});
