import { z } from 'zod';
import { listingPatchSchema } from '../../../../lib/specs';
import { VersionSchema } from '../../../../lib/schemas/listings';
import { canSeeUnpublished, getListing, requireListingEditor } from '../../../../server/listings/access';
import { parseWith, readJson } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { notFound } from '../../../../server/http/errors';
import { archiveListing, isPublic, labOf, ownerShape, publicShape, updateListing } from '../../../../server/listings/service';

/** The public version when the listing is visible; its lab and moderators also get the working copy. */
export const GET = endpoint(async (ctx) => {
  const listing = await getListing(ctx.params.id!);
  const insider = listing !== null && canSeeUnpublished(ctx.locals.user, listing);
  if (!listing || (!isPublic(listing) && !insider)) throw notFound('No such listing.');
  const lab = await labOf(listing.labId);
  return {
    listing: isPublic(listing) ? publicShape(listing, lab) : null,
    ...(insider ? { working: ownerShape(listing) } : {}),
  };
});

export const PATCH = endpoint(async (ctx) => {
  const { user, listing } = await requireListingEditor(ctx, ctx.params.id!);
  const raw = await readJson(ctx.request, z.unknown());
  const { version } = parseWith(VersionSchema, raw);
  const patch = parseWith(listingPatchSchema(listing.category), raw);
  const updated = await updateListing(user, listing, patch, version);
  return { listing: ownerShape(updated) };
});

export const DELETE = endpoint(async (ctx) => {
  const { user, listing } = await requireListingEditor(ctx, ctx.params.id!);
  const updated = await archiveListing(user, listing);
  return { listing: ownerShape(updated) };
});
