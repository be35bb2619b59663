import { z } from 'zod';
import { requireLabMember, requireVerifiedUser } from '../../../server/auth/guards';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { HttpError } from '../../../server/http/errors';
import { onboardingLink } from '../../../server/payments/payouts';

const BodySchema = z.object({ labId: z.string().max(100).optional() });

/** The lab owner connects (or finishes connecting) the payout account on the provider's onboarding page. */
export const POST = endpoint(async (ctx) => {
  const user = requireVerifiedUser(ctx);
  const { labId } = await readJson(ctx.request, BodySchema);
  const owned = user.labs.filter((l) => l.role === 'owner');
  const target = labId ?? (owned.length === 1 ? owned[0]!.id : null);
  if (!target) throw new HttpError(400, 'validation_failed', 'Say which lab connects its payout account.', { labId: 'Choose a lab.' });
  const { lab } = await requireLabMember(ctx, target, { owner: true });
  return onboardingLink(user, lab.id);
});
