import { RefundSchema } from '../../../../lib/schemas/checkout';
import { hasRole, requireUser } from '../../../../server/auth/guards';
import { readJson } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { forbidden } from '../../../../server/http/errors';
import { orderDetail, refundOrder, requestRefund, requireOrderReader } from '../../../../server/payments/orders';

/** The buyer asks for a refund; a moderator or admin makes one (all or part). */
export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { order, side } = await requireOrderReader(user, ctx.params.id!);
  const { amountCents, reason } = await readJson(ctx.request, RefundSchema);
  if (hasRole(user, 'moderator', 'admin') && side !== 'buyer')
    return { order: await orderDetail(await refundOrder(user, order, amountCents, reason)) };
  if (side !== 'buyer') throw forbidden('Refunds are asked for by the buyer and made by a moderator.');
  return { order: await orderDetail(await requestRefund(user, order, reason)) };
});
