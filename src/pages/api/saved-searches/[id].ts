import { z } from 'zod';
import { requireUser } from '../../../server/auth/guards';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { deleteSavedSearch, setSavedSearchActive } from '../../../server/search/saved-searches';

const ActiveSchema = z.object({ active: z.boolean() }).strict();

/** Resume or stop the e-mails of one of the caller's saved searches. */
export const PATCH = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { active } = await readJson(ctx.request, ActiveSchema);
  return { savedSearch: await setSavedSearchActive(user, ctx.params.id!, active) };
});

export const DELETE = endpoint(async (ctx) => {
  await deleteSavedSearch(requireUser(ctx), ctx.params.id!);
  return { deleted: true };
});
