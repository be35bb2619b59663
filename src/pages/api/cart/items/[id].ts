import { requireUser } from '../../../../server/auth/guards';
import { endpoint } from '../../../../server/http/endpoint';
import { removeFromCart } from '../../../../server/payments/cart';

export const DELETE = endpoint(async (ctx) => removeFromCart(requireUser(ctx), ctx.params.id!));
