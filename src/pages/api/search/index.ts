import { TextSearchQuerySchema } from '../../../lib/schemas/search';
import { readQuery } from '../../../server/http/body';
import { clientAddress } from '../../../server/http/client-address';
import { endpoint } from '../../../server/http/endpoint';
import { rateLimit } from '../../../server/http/rate-limit';
import { runTextSearch } from '../../../server/search/service';

/** Text search with filters and facet counts, for everyone: `?q=&category=a,b&condition=&band=&price=&region=&measured=&sort=&page=&pageSize=`. */
export const GET = endpoint(async (ctx) => {
  await rateLimit(`search:${clientAddress(ctx)}`, 600, 60_000);
  return runTextSearch(readQuery(ctx.url, TextSearchQuerySchema));
});
