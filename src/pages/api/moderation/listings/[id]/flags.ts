import { FlagsSchema } from '../../../../../lib/schemas/listings';
import { requireRole } from '../../../../../server/auth/guards';
import { getListing } from '../../../../../server/listings/access';
import { readJson } from '../../../../../server/http/body';
import { endpoint } from '../../../../../server/http/endpoint';
import { notFound } from '../../../../../server/http/errors';
import { flagListing, ownerShape } from '../../../../../server/listings/service';

export const POST = endpoint(async (ctx) => {
  const moderator = requireRole(ctx, 'moderator', 'admin');
  const flags = await readJson(ctx.request, FlagsSchema);
  const listing = await getListing(ctx.params.id!);
  if (!listing) throw notFound('No such listing.');
  const updated = await flagListing(moderator, listing, {
    hazards: flags.hazards,
    exportControlled: flags.exportControlled,
    exportNote: flags.exportNote ?? null,
  });
  return { listing: ownerShape(updated) };
});
