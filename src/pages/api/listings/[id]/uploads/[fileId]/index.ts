import { endpoint } from '../../../../../../server/http/endpoint';
import { requireListingEditor } from '../../../../../../server/listings/access';
import { removeFile } from '../../../../../../server/listings/uploads';

export const DELETE = endpoint(async (ctx) => {
  const { user, listing } = await requireListingEditor(ctx, ctx.params.id!);
  await removeFile(user, listing, ctx.params.fileId!);
  return { ok: true };
});
