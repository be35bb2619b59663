import { FitInputError } from '../../../lib/fit';
import { GoalSearchSchema } from '../../../lib/schemas/search';
import { readJson } from '../../../server/http/body';
import { clientAddress } from '../../../server/http/client-address';
import { endpoint } from '../../../server/http/endpoint';
import { HttpError } from '../../../server/http/errors';
import { rateLimit } from '../../../server/http/rate-limit';
import { runGoalSearch } from '../../../server/search/service';

/** A goal search: `{ mode, goal, q?, filters?, sort?, page?, pageSize? }` → ranked results with their fit, total and facets. */
export const POST = endpoint(async (ctx) => {
  await rateLimit(`search:${clientAddress(ctx)}`, 600, 60_000);
  const req = await readJson(ctx.request, GoalSearchSchema);
  try {
    return await runGoalSearch(req);
  } catch (e) {
    // the engine refused the goal itself (a combination zod cannot see, e.g. a target out of range for the length)
    if (e instanceof FitInputError) throw new HttpError(422, 'unprocessable', e.message, { [e.field]: e.message });
    throw e;
  }
});
