import { readQuery } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { notFound } from '../../../server/http/errors';
import { FileQuerySchema } from '../../../lib/schemas/uploads';
import { defaultVariant, presignFileUrl, requireFileReader } from '../../../server/listings/uploads';

export const GET = endpoint(async (ctx) => {
  const file = await requireFileReader(ctx, ctx.params.fileId!);
  const { variant = defaultVariant(file) } = readQuery(ctx.url, FileQuerySchema);
  const url = await presignFileUrl(file, variant);
  if (!url) throw notFound(`This file has no ${variant} version.`);
  // A minute of caching saves re-signing for every re-render of a page, and stays well inside the URL's five minutes.
  return new Response(null, { status: 302, headers: { location: url, 'cache-control': 'private, max-age=60' } });
});
