import { ModerationSchema } from '../../../../../lib/schemas/listings';
import { requireRole } from '../../../../../server/auth/guards';
import { getListing } from '../../../../../server/listings/access';
import { readJson } from '../../../../../server/http/body';
import { endpoint } from '../../../../../server/http/endpoint';
import { notFound } from '../../../../../server/http/errors';
import { moderateListing, ownerShape } from '../../../../../server/listings/service';

export const POST = endpoint(async (ctx) => {
  const moderator = requireRole(ctx, 'moderator', 'admin');
  const { action, reason } = await readJson(ctx.request, ModerationSchema);
  const listing = await getListing(ctx.params.id!);
  if (!listing) throw notFound('No such listing.');
  return { listing: ownerShape(await moderateListing(moderator, listing, action, reason)) };
});
