import { CheckoutSchema } from '../../lib/schemas/checkout';
import { requireVerifiedUser } from '../../server/auth/guards';
import { readJson } from '../../server/http/body';
import { endpoint } from '../../server/http/endpoint';
import { jsonResponse } from '../../server/http/errors';
import { startCheckout } from '../../server/payments/checkout';

export const POST = endpoint(async (ctx) => {
  const user = requireVerifiedUser(ctx);
  const input = await readJson(ctx.request, CheckoutSchema);
  return jsonResponse(await startCheckout(user, input), 201);
});
