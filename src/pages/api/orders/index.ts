import { z } from 'zod';
import { ORDER_STATUSES } from '../../../server/db/schema';
import { requireUser } from '../../../server/auth/guards';
import { readQuery } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { listOrdersFor, orderDetail } from '../../../server/payments/orders';

const QuerySchema = z.object({ as: z.enum(['buyer', 'lab']).optional(), status: z.enum(ORDER_STATUSES).optional() });

export const GET = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const q = readQuery(ctx.url, QuerySchema);
  const rows = await listOrdersFor(user, q);
  return { orders: await Promise.all(rows.map(orderDetail)) };
});
