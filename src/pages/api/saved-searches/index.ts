import { SavedSearchCreateSchema } from '../../../lib/schemas/search';
import { requireUser, requireVerifiedUser } from '../../../server/auth/guards';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { jsonResponse } from '../../../server/http/errors';
import { createSavedSearch, listSavedSearches } from '../../../server/search/saved-searches';

export const GET = endpoint(async (ctx) => ({ savedSearches: await listSavedSearches(requireUser(ctx)) }));

/** Saving needs a confirmed address: the point of a saved search is the e-mail. */
export const POST = endpoint(async (ctx) => {
  const user = requireVerifiedUser(ctx);
  const input = await readJson(ctx.request, SavedSearchCreateSchema);
  return jsonResponse({ savedSearch: await createSavedSearch(user, input) }, 201);
});
