import { requirePlatform } from '../access';
import type { StripeFakeContext } from '../context';
import { resourceMissing } from '../errors';
import { fieldFilter, paginate, rangeFilter } from '../list';
import type { Charge, PaymentIntent, PaymentMethod } from '../payments';
import type { Router } from '../router';

/** Read access to what a card payment leaves behind: PaymentIntents, their Charges and PaymentMethods. */
export function addPaymentRoutes(router: Router<StripeFakeContext>): void {
  router.get('/v1/payment_intents', (request, { state }) => {
    requirePlatform(request);
    const inRange = rangeFilter(request.query, 'created');
    return paginate(state.list<PaymentIntent>('payment_intent').filter(inRange), request.query, '/v1/payment_intents', 'payment_intent');
  });

  router.get('/v1/payment_intents/:id', (request, { state }) => {
    requirePlatform(request);
    const id = request.params.id ?? '';
    const paymentIntent = state.get<PaymentIntent>('payment_intent', id);
    if (!paymentIntent) throw resourceMissing('payment_intent', id);
    return paymentIntent;
  });

  router.get('/v1/charges', (request, { state }) => {
    requirePlatform(request);
    const filters = [
      fieldFilter(request.query, 'payment_intent'),
      fieldFilter(request.query, 'transfer_group'),
      rangeFilter(request.query, 'created'),
    ];
    const charges = state.list<Charge>('charge').filter((charge) => filters.every((keep) => keep(charge)));
    return paginate(charges, request.query, '/v1/charges', 'charge');
  });

  router.get('/v1/charges/:id', (request, { state }) => {
    requirePlatform(request);
    const id = request.params.id ?? '';
    const charge = state.get<Charge>('charge', id);
    if (!charge) throw resourceMissing('charge', id);
    return charge;
  });

  router.get('/v1/payment_methods/:id', (request, { state }) => {
    requirePlatform(request);
    const id = request.params.id ?? '';
    const paymentMethod = state.get<PaymentMethod>('payment_method', id);
    if (!paymentMethod) throw resourceMissing('payment_method', id);
    return paymentMethod;
  });
}
