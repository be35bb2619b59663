import { endpoint } from '../../../../../../server/http/endpoint';
import { requireListingEditor } from '../../../../../../server/listings/access';
import { completeUpload } from '../../../../../../server/listings/uploads';

export const POST = endpoint(async (ctx) => {
  const { user, listing } = await requireListingEditor(ctx, ctx.params.id!);
  return completeUpload(user, listing, ctx.params.fileId!);
});
