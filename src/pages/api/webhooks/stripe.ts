import { endpoint } from '../../../server/http/endpoint';
import { readLimited } from '../../../server/http/body';
import { processEvent, verifyEvent } from '../../../server/payments/webhooks';

const MAX_EVENT_BYTES = 512 * 1024;

/** Public by design: the signature on the raw body is the authentication; a bad one changes nothing. */
export const POST = endpoint(async ({ request }) => {
  const raw = await readLimited(request, MAX_EVENT_BYTES);
  const event = verifyEvent(raw, request.headers.get('stripe-signature'));
  const changed = await processEvent(event);
  return { received: true, duplicate: !changed };
});
