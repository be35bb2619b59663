import { requirePlatform } from '../access';
import { onboardingPagePath, openRequirements, requirements, type ConnectedAccount } from '../connect';
import type { StripeFakeContext } from '../context';
import { invalidRequest, resourceMissing } from '../errors';
import { newId, randomToken, unixSeconds } from '../ids';
import { paginate, rangeFilter } from '../list';
import { countryCurrency } from '../money';
import { Params } from '../params';
import type { FakeRequest, Router } from '../router';

const ACCOUNT_TYPES = ['custom', 'express', 'standard'] as const;
const BUSINESS_TYPES = ['company', 'government_entity', 'individual', 'non_profit'] as const;
const LINK_TYPES = ['account_onboarding', 'account_update'] as const;
// The provider's account links stop working a few minutes after they are made.
const LINK_LIFETIME_SECONDS = 300;

function capabilitiesParam(params: Params): Record<string, 'inactive'> {
  const hash = params.hash('capabilities');
  if (!hash) return {};
  const requested: Record<string, 'inactive'> = {};
  for (const name of hash.keys()) {
    const capability = hash.requiredHash(name).only('requested');
    if (capability.boolean('requested')) requested[name] = 'inactive';
  }
  return requested;
}

function countryParam(params: Params, fallback: string): string {
  const country = params.string('country')?.toUpperCase() ?? fallback;
  if (!/^[A-Z]{2}$/.test(country)) throw invalidRequest(`Country '${country}' is unknown.`, { param: 'country' });
  return country;
}

function createAccount(request: FakeRequest, context: StripeFakeContext): ConnectedAccount {
  requirePlatform(request);
  const params = new Params(request.body).only(
    'business_profile',
    'business_type',
    'capabilities',
    'country',
    'default_currency',
    'email',
    'metadata',
    'type',
  );
  const type = params.requiredEnum('type', ACCOUNT_TYPES);
  const country = countryParam(params, context.settings.platformCountry);
  const profile = params.hash('business_profile')?.only('mcc', 'name', 'product_description', 'support_email', 'url');
  const id = newId('acct', 16);
  return context.state.insert<ConnectedAccount>({
    id,
    object: 'account',
    business_profile: {
      mcc: profile?.string('mcc') ?? null,
      name: profile?.string('name') ?? null,
      product_description: profile?.string('product_description') ?? null,
      support_address: null,
      support_email: profile?.string('support_email') ?? null,
      support_phone: null,
      support_url: null,
      url: profile?.url('url') ?? null,
    },
    business_type: params.enum('business_type', BUSINESS_TYPES) ?? null,
    capabilities: capabilitiesParam(params),
    charges_enabled: false,
    controller: {
      fees: { payer: 'application' },
      is_controller: true,
      losses: { payments: 'application' },
      requirement_collection: type === 'custom' ? 'application' : 'stripe',
      stripe_dashboard: { type: type === 'standard' ? 'full' : type === 'express' ? 'express' : 'none' },
      type: 'application',
    },
    country,
    created: unixSeconds(),
    default_currency: params.currency('default_currency') ?? countryCurrency(country, context.settings.platformCurrency),
    details_submitted: false,
    email: params.string('email') ?? null,
    external_accounts: { object: 'list', data: [], has_more: false, total_count: 0, url: `/v1/accounts/${id}/external_accounts` },
    future_requirements: requirements([]),
    metadata: params.metadata(),
    payouts_enabled: false,
    requirements: openRequirements(),
    settings: {
      payouts: { debit_negative_balances: true, schedule: { delay_days: 2, interval: 'manual' }, statement_descriptor: null },
    },
    tos_acceptance: { date: null, ip: null, user_agent: null },
    type,
  });
}

function createAccountLink(request: FakeRequest, context: StripeFakeContext): Record<string, unknown> {
  requirePlatform(request);
  const params = new Params(request.body).only('account', 'collect', 'collection_options', 'refresh_url', 'return_url', 'type');
  const accountId = params.requiredString('account');
  if (!context.state.get('account', accountId)) throw resourceMissing('account', accountId, 'account', 400);
  // Both types lead to the same page on the fake, which completes onboarding.
  params.requiredEnum('type', LINK_TYPES);
  const refreshUrl = params.requiredUrl('refresh_url');
  const returnUrl = params.requiredUrl('return_url');
  const created = unixSeconds();
  const token = randomToken(32);
  context.state.accountLinks[token] = {
    account: accountId,
    refreshUrl,
    returnUrl,
    expiresAt: created + LINK_LIFETIME_SECONDS,
    used: false,
  };
  return {
    object: 'account_link',
    created,
    expires_at: created + LINK_LIFETIME_SECONDS,
    url: `${context.settings.publicUrl}${onboardingPagePath(token)}`,
  };
}

export function addAccountRoutes(router: Router<StripeFakeContext>): void {
  router.post('/v1/accounts', createAccount);

  router.get('/v1/accounts', (request, { state }) => {
    requirePlatform(request);
    const accounts = state.list<ConnectedAccount>('account').filter(rangeFilter(request.query, 'created'));
    return paginate(accounts, request.query, '/v1/accounts', 'account');
  });

  router.get('/v1/accounts/:id', (request, { state }) => {
    requirePlatform(request);
    const id = request.params.id ?? '';
    const account = state.get<ConnectedAccount>('account', id);
    if (!account) throw resourceMissing('account', id);
    return account;
  });

  router.post('/v1/account_links', createAccountLink);
}
