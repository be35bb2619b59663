import { requireUser } from '../../../../server/auth/guards';
import { endpoint } from '../../../../server/http/endpoint';
import { confirmReceipt, orderDetail, requireOrderReader } from '../../../../server/payments/orders';

export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { order } = await requireOrderReader(user, ctx.params.id!);
  return { order: await orderDetail(await confirmReceipt(user, order)) };
});
