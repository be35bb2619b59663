import { and, desc, eq, gte } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '../../../server/db/client';
import { ORDER_STATUSES, orders } from '../../../server/db/schema';
import { requireRole } from '../../../server/auth/guards';
import { readQuery } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { orderDetail } from '../../../server/payments/orders';

const QuerySchema = z.object({
  status: z.enum(ORDER_STATUSES).optional(),
  lab: z.string().max(64).optional(),
  since: z.coerce.date().optional(),
  limit: z.coerce.number().int().min(1).max(500).default(200),
});

export const GET = endpoint(async (ctx) => {
  requireRole(ctx, 'moderator', 'admin');
  const q = readQuery(ctx.url, QuerySchema);
  const rows = await getDb()
    .select()
    .from(orders)
    .where(
      and(
        q.status ? eq(orders.status, q.status) : undefined,
        q.lab ? eq(orders.labId, q.lab) : undefined,
        q.since ? gte(orders.createdAt, q.since) : undefined,
      ),
    )
    .orderBy(desc(orders.createdAt))
    .limit(q.limit);
  return { orders: await Promise.all(rows.map(orderDetail)) };
});
