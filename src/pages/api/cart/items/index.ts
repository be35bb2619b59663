import { CartItemSchema } from '../../../../lib/schemas/checkout';
import { requireUser } from '../../../../server/auth/guards';
import { readJson } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { jsonResponse } from '../../../../server/http/errors';
import { addToCart } from '../../../../server/payments/cart';

export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { listingId, quantity } = await readJson(ctx.request, CartItemSchema);
  return jsonResponse(await addToCart(user, listingId, quantity), 201);
});
