import { ShipSchema } from '../../../../lib/schemas/checkout';
import { requireUser } from '../../../../server/auth/guards';
import { readJson } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { orderDetail, requireOrderReader, shipOrder } from '../../../../server/payments/orders';

export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { order } = await requireOrderReader(user, ctx.params.id!);
  const { carrier, trackingNumber } = await readJson(ctx.request, ShipSchema);
  return { order: await orderDetail(await shipOrder(user, order, carrier, trackingNumber)) };
});
