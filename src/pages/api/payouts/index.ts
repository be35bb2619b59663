import { z } from 'zod';
import { requireLabMember, requireUser } from '../../../server/auth/guards';
import { readQuery } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { HttpError } from '../../../server/http/errors';
import { payoutsView } from '../../../server/payments/payouts';

const QuerySchema = z.object({ lab: z.string().max(100).optional() });

/** The lab's balance, transfers and payouts; `?lab=` when the caller is in several labs. */
export const GET = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { lab } = readQuery(ctx.url, QuerySchema);
  const target = lab ?? (user.labs.length === 1 ? user.labs[0]!.id : null);
  if (!target)
    throw new HttpError(400, 'validation_failed', user.labs.length ? 'Say which lab: ?lab=' : 'You are not in a lab.', {
      lab: 'Choose a lab.',
    });
  const { lab: l } = await requireLabMember(ctx, target);
  return { lab: { id: l.id, name: l.name }, ...(await payoutsView(l.id)) };
});
