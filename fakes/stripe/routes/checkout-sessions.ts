import { requirePlatform } from '../access';
import { expireCheckoutSession, lineItemsOf, payPagePath, type CheckoutSession } from '../checkout';
import type { StripeFakeContext } from '../context';
import { invalidRequest, resourceMissing } from '../errors';
import { eventRequest } from '../events';
import { newId, unixSeconds } from '../ids';
import { fieldFilter, paginate, rangeFilter } from '../list';
import { Params } from '../params';
import type { FakeRequest, Router } from '../router';
import type { SessionExtras, StripeObject } from '../state';

const DEFAULT_LIFETIME_SECONDS = 24 * 60 * 60;
const MAX_LIFETIME_SECONDS = 24 * 60 * 60;

// Accepted so that an app written for the provider runs unchanged; the hosted page ignores them.
const IGNORED_PARAMS = [
  'billing_address_collection',
  'custom_text',
  'customer_creation',
  'locale',
  'payment_method_types',
  'phone_number_collection',
  'submit_type',
];

interface LineItemInput {
  currency: string;
  unitAmount: number;
  quantity: number;
  name: string;
  description: string | null;
  productMetadata: Record<string, string>;
}

function lineItemInput(item: Params): LineItemInput {
  item.only('price', 'price_data', 'quantity');
  const price = item.string('price');
  if (price !== undefined) throw resourceMissing('price', price, item.paramName('price'), 400);
  const priceData = item.requiredHash('price_data').only('currency', 'product', 'product_data', 'tax_behavior', 'unit_amount');
  const product = priceData.string('product');
  if (product !== undefined) throw resourceMissing('product', product, priceData.paramName('product'), 400);
  const productData = priceData.requiredHash('product_data').only('description', 'images', 'metadata', 'name', 'tax_code');
  return {
    currency: priceData.requiredCurrency('currency'),
    unitAmount: priceData.requiredInteger('unit_amount', { min: 0 }),
    quantity: item.requiredInteger('quantity', { min: 1 }),
    name: productData.requiredString('name'),
    description: productData.string('description') ?? null,
    productMetadata: productData.metadata(),
  };
}

function lineItemObject(input: LineItemInput, created: number): StripeObject {
  const amount = input.unitAmount * input.quantity;
  return {
    id: newId('li'),
    object: 'item',
    adjustable_quantity: null,
    amount_discount: 0,
    amount_subtotal: amount,
    amount_tax: 0,
    amount_total: amount,
    currency: input.currency,
    description: input.name,
    metadata: {},
    price: {
      id: newId('price'),
      object: 'price',
      active: false,
      billing_scheme: 'per_unit',
      created,
      currency: input.currency,
      custom_unit_amount: null,
      livemode: false,
      lookup_key: null,
      metadata: {},
      nickname: null,
      product: newId('prod', 14),
      recurring: null,
      tax_behavior: 'unspecified',
      tiers_mode: null,
      transform_quantity: null,
      type: 'one_time',
      unit_amount: input.unitAmount,
      unit_amount_decimal: String(input.unitAmount),
    },
    quantity: input.quantity,
  };
}

function expiresAt(params: Params, created: number): number {
  const requested = params.integer('expires_at');
  if (requested === undefined) return created + DEFAULT_LIFETIME_SECONDS;
  // The provider also wants at least 30 minutes; the fake takes less, so tests can let sessions run out.
  if (requested <= created) {
    throw invalidRequest('The `expires_at` timestamp must be in the future.', { param: 'expires_at' });
  }
  if (requested > created + MAX_LIFETIME_SECONDS) {
    throw invalidRequest('The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.', {
      param: 'expires_at',
    });
  }
  return requested;
}

function paymentIntentData(params: Params): SessionExtras['paymentIntentData'] {
  const data = params.hash('payment_intent_data')?.only('description', 'metadata', 'transfer_group');
  return {
    metadata: data?.metadata() ?? {},
    transferGroup: data?.string('transfer_group') ?? null,
    description: data?.string('description') ?? null,
  };
}

function createSession(request: FakeRequest, context: StripeFakeContext): CheckoutSession {
  requirePlatform(request);
  const params = new Params(request.body).only(
    'cancel_url',
    'client_reference_id',
    'customer_email',
    'expires_at',
    'line_items',
    'metadata',
    'mode',
    'payment_intent_data',
    'success_url',
    'ui_mode',
    ...IGNORED_PARAMS,
  );
  const mode = params.requiredString('mode');
  if (mode !== 'payment') {
    throw invalidRequest(`The payments fake supports Checkout in mode 'payment' only, not '${mode}'.`, { param: 'mode' });
  }
  const uiMode = params.string('ui_mode') ?? 'hosted';
  if (uiMode !== 'hosted') {
    throw invalidRequest(`The payments fake serves hosted Checkout only (ui_mode 'hosted'), not '${uiMode}'.`, { param: 'ui_mode' });
  }
  const inputs = (params.hashes('line_items') ?? []).map(lineItemInput);
  const [first] = inputs;
  if (!first) throw invalidRequest('Missing required param: line_items.', { code: 'parameter_missing', param: 'line_items' });
  if (inputs.some((input) => input.currency !== first.currency)) {
    throw invalidRequest('All line items of a Checkout Session in payment mode must have the same currency.', { param: 'line_items' });
  }

  const created = unixSeconds();
  const lineItems = inputs.map((input) => lineItemObject(input, created));
  const amount = lineItems.reduce((sum, item) => sum + (item.amount_total as number), 0);
  const id = newId('cs_test', 58);
  const session = context.state.insert<CheckoutSession>({
    id,
    object: 'checkout.session',
    adaptive_pricing: null,
    after_expiration: null,
    allow_promotion_codes: null,
    amount_subtotal: amount,
    amount_total: amount,
    automatic_tax: { enabled: false, liability: null, provider: null, status: null },
    billing_address_collection: null,
    cancel_url: params.url('cancel_url') ?? null,
    client_reference_id: params.string('client_reference_id') ?? null,
    client_secret: null,
    collected_information: null,
    consent: null,
    consent_collection: null,
    created,
    currency: first.currency,
    currency_conversion: null,
    custom_fields: [],
    custom_text: { after_submit: null, shipping_address: null, submit: null, terms_of_service_acceptance: null },
    customer: null,
    customer_account: null,
    customer_creation: 'if_required',
    customer_details: null,
    customer_email: params.string('customer_email') ?? null,
    discounts: [],
    expires_at: expiresAt(params, created),
    invoice: null,
    invoice_creation: null,
    livemode: false,
    locale: null,
    metadata: params.metadata(),
    mode: 'payment',
    payment_intent: null,
    payment_link: null,
    payment_method_collection: 'if_required',
    payment_method_configuration_details: null,
    payment_method_options: { card: { request_three_d_secure: 'automatic' } },
    payment_method_types: ['card'],
    payment_status: 'unpaid',
    permissions: null,
    phone_number_collection: { enabled: false },
    recovered_from: null,
    saved_payment_method_options: null,
    setup_intent: null,
    shipping_address_collection: null,
    shipping_cost: null,
    shipping_options: [],
    status: 'open',
    submit_type: null,
    subscription: null,
    success_url: params.url('success_url') ?? null,
    total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
    ui_mode: 'hosted',
    url: `${context.settings.publicUrl}${payPagePath(id)}`,
    wallet_options: null,
  });
  context.state.checkoutSessions[id] = { lineItems, paymentIntentData: paymentIntentData(params) };
  context.scheduler.schedule('expire_checkout_session', id, '', session.expires_at * 1000);
  return session;
}

function sessionById(request: FakeRequest, context: StripeFakeContext): CheckoutSession {
  const id = request.params.id ?? '';
  const session = context.state.get<CheckoutSession>('checkout.session', id);
  if (!session) throw resourceMissing('checkout.session', id);
  return session;
}

export function addCheckoutSessionRoutes(router: Router<StripeFakeContext>): void {
  router.post('/v1/checkout/sessions', createSession);

  router.get('/v1/checkout/sessions', (request, { state }) => {
    requirePlatform(request);
    const filters = [
      fieldFilter(request.query, 'status'),
      fieldFilter(request.query, 'payment_intent'),
      rangeFilter(request.query, 'created'),
    ];
    const sessions = state.list<CheckoutSession>('checkout.session').filter((session) => filters.every((keep) => keep(session)));
    return paginate(sessions, request.query, '/v1/checkout/sessions', 'checkout.session');
  });

  router.get('/v1/checkout/sessions/:id', (request, context) => {
    requirePlatform(request);
    return sessionById(request, context);
  });

  router.post('/v1/checkout/sessions/:id/expire', (request, context) => {
    requirePlatform(request);
    new Params(request.body).only();
    const session = sessionById(request, context);
    if (session.status === 'open') {
      expireCheckoutSession(context, session, eventRequest(request));
      return session;
    }
    throw invalidRequest(
      `Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of \`${session.status}\`.`,
    );
  });

  router.get('/v1/checkout/sessions/:id/line_items', (request, context) => {
    requirePlatform(request);
    const session = sessionById(request, context);
    return paginate(lineItemsOf(context.state, session.id), request.query, `/v1/checkout/sessions/${session.id}/line_items`, 'item');
  });
}
