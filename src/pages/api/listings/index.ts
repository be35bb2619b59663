import { z } from 'zod';
import { ListingQuerySchema } from '../../../lib/schemas/listings';
import { ListingInputSchema } from '../../../lib/specs';
import { requireRole, requireUser, requireVerifiedUser } from '../../../server/auth/guards';
import { parseWith, readJson, readQuery } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { jsonResponse } from '../../../server/http/errors';
import { chooseLab, createListing, listMine, listPublic } from '../../../server/listings/service';

/** Live listings for everyone; `?mine=1`: every listing of the caller's labs. */
export const GET = endpoint(async (ctx) => {
  const q = readQuery(ctx.url, ListingQuerySchema);
  if (q.mine === '1') return listMine(requireUser(ctx), q);
  return listPublic(q);
});

const LabChoiceSchema = z.object({ labId: z.string().max(64).optional() });

export const POST = endpoint(async (ctx) => {
  requireVerifiedUser(ctx);
  const user = requireRole(ctx, 'seller');
  const raw = await readJson(ctx.request, z.unknown());
  const { labId } = parseWith(LabChoiceSchema, raw);
  const input = parseWith(ListingInputSchema, raw);
  const listing = await createListing(user, chooseLab(user, labId), input);
  return jsonResponse({ id: listing.id, listing: { id: listing.id, status: listing.status, version: listing.version } }, 201);
});
