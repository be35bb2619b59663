import { requireListingEditor } from '../../../../server/listings/access';
import { endpoint } from '../../../../server/http/endpoint';
import { ownerShape, submitListing } from '../../../../server/listings/service';

export const POST = endpoint(async (ctx) => {
  const { user, listing } = await requireListingEditor(ctx, ctx.params.id!);
  return { listing: ownerShape(await submitListing(user, listing)) };
});
