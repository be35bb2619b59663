import { InviteSchema } from '../../../../../lib/schemas/labs';
import { requireLabMember, requireVerifiedUser } from '../../../../../server/auth/guards';
import { readJson } from '../../../../../server/http/body';
import { endpoint } from '../../../../../server/http/endpoint';
import { jsonResponse } from '../../../../../server/http/errors';
import { inviteMember } from '../../../../../server/labs/labs';

export const POST = endpoint(async (ctx) => {
  const { user, lab } = await requireLabMember(ctx, ctx.params.lab!, { owner: true });
  requireVerifiedUser(ctx);
  const { email } = await readJson(ctx.request, InviteSchema);
  return jsonResponse({ invite: await inviteMember(user, lab, email) }, 201);
});
