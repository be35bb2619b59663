import { requireUser } from '../../../../server/auth/guards';
import { endpoint } from '../../../../server/http/endpoint';
import { orderDetail, requireOrderReader } from '../../../../server/payments/orders';

export const GET = endpoint(async (ctx) => {
  const { order } = await requireOrderReader(requireUser(ctx), ctx.params.id!);
  return { order: await orderDetail(order) };
});
