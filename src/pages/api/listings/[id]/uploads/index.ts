import { readJson } from '../../../../../server/http/body';
import { endpoint } from '../../../../../server/http/endpoint';
import { jsonResponse } from '../../../../../server/http/errors';
import { requireListingEditor } from '../../../../../server/listings/access';
import { CreateUploadSchema } from '../../../../../lib/schemas/uploads';
import { createUpload } from '../../../../../server/listings/uploads';

export const POST = endpoint(async (ctx) => {
  const { user, listing } = await requireListingEditor(ctx, ctx.params.id!);
  const input = await readJson(ctx.request, CreateUploadSchema);
  return jsonResponse(await createUpload(user, listing, input), 201);
});
