import { UnsubscribeSchema } from '../../../lib/schemas/search';
import { readJson } from '../../../server/http/body';
import { clientAddress } from '../../../server/http/client-address';
import { endpoint } from '../../../server/http/endpoint';
import { notFound } from '../../../server/http/errors';
import { rateLimit } from '../../../server/http/rate-limit';
import { unsubscribe } from '../../../server/search/saved-searches';

/** Public: the token from a saved-search e-mail stops that search's e-mails, no sign-in needed. */
export const POST = endpoint(async (ctx) => {
  await rateLimit(`unsubscribe:${clientAddress(ctx)}`, 30, 60_000);
  const { token } = await readJson(ctx.request, UnsubscribeSchema);
  const done = await unsubscribe(token);
  if (!done)
    throw notFound(
      'This link does not stop any saved search: a newer e-mail may carry a fresh one, or the search was deleted. Signed in, you can manage your saved searches on their page.',
    );
  return { unsubscribed: true, name: done.name };
});
