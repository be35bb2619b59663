import { endpoint } from '../../../server/http/endpoint';
import { HttpError } from '../../../server/http/errors';
import { processEvent, verifyEvent } from '../../../server/payments/webhooks';

const MAX_EVENT_BYTES = 512 * 1024;

/** Public by design: the signature on the raw body is the authentication; a bad one changes nothing. */
export const POST = endpoint(async ({ request }) => {
  const raw = await request.text();
  if (raw.length > MAX_EVENT_BYTES) throw new HttpError(413, 'payload_too_large', 'Event too large.');
  const event = verifyEvent(raw, request.headers.get('stripe-signature'));
  const changed = await processEvent(event);
  return { received: true, duplicate: !changed };
});
