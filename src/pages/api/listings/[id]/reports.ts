import { ReportSchema } from '../../../../lib/schemas/listings';
import { requireUser } from '../../../../server/auth/guards';
import { getListing } from '../../../../server/listings/access';
import { readJson } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { jsonResponse, notFound } from '../../../../server/http/errors';
import { reportListing } from '../../../../server/listings/messages';
import { isPublic } from '../../../../server/listings/service';

export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { reason } = await readJson(ctx.request, ReportSchema);
  const listing = await getListing(ctx.params.id!);
  if (!listing || !isPublic(listing)) throw notFound('No such listing.');
  return jsonResponse(await reportListing(user, listing, reason), 201);
});
