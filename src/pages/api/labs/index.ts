import { CreateLabSchema } from '../../../lib/schemas/labs';
import { requireUser, requireVerifiedUser } from '../../../server/auth/guards';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { jsonResponse } from '../../../server/http/errors';
import { createLab } from '../../../server/labs/labs';

export const GET = endpoint(async (ctx) => ({ labs: requireUser(ctx).labs }));

export const POST = endpoint(async (ctx) => {
  const user = requireVerifiedUser(ctx);
  const input = await readJson(ctx.request, CreateLabSchema);
  return jsonResponse({ lab: await createLab(user, input) }, 201);
});
