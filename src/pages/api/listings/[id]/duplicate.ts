import { requireListingEditor } from '../../../../server/listings/access';
import { endpoint } from '../../../../server/http/endpoint';
import { jsonResponse } from '../../../../server/http/errors';
import { duplicateListing, ownerShape } from '../../../../server/listings/service';

export const POST = endpoint(async (ctx) => {
  const { user, listing } = await requireListingEditor(ctx, ctx.params.id!);
  const copy = await duplicateListing(user, listing);
  return jsonResponse({ id: copy.id, listing: ownerShape(copy) }, 201);
});
