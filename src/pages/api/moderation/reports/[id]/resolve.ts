import { requireRole } from '../../../../../server/auth/guards';
import { endpoint } from '../../../../../server/http/endpoint';
import { resolveReport } from '../../../../../server/listings/messages';

export const POST = endpoint(async (ctx) => {
  const moderator = requireRole(ctx, 'moderator', 'admin');
  await resolveReport(moderator, ctx.params.id!);
  return { ok: true };
});
