import { requireUser } from '../../../server/auth/guards';
import { endpoint } from '../../../server/http/endpoint';
import { getCart } from '../../../server/payments/cart';

export const GET = endpoint(async (ctx) => getCart(requireUser(ctx)));
