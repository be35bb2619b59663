import { QuestionSchema } from '../../../../lib/schemas/listings';
import { requireVerifiedUser } from '../../../../server/auth/guards';
import { getListing } from '../../../../server/listings/access';
import { readJson } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { jsonResponse, notFound } from '../../../../server/http/errors';
import { askQuestion } from '../../../../server/listings/messages';
import { isPublic } from '../../../../server/listings/service';

export const POST = endpoint(async (ctx) => {
  const user = requireVerifiedUser(ctx);
  const { body } = await readJson(ctx.request, QuestionSchema);
  const listing = await getListing(ctx.params.id!);
  if (!listing || !isPublic(listing)) throw notFound('No such listing.');
  return jsonResponse(await askQuestion(user, listing, body), 201);
});
