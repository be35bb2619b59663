import type { StripeFakeContext } from './context';
import { newId, randomToken, unixSeconds } from './ids';
import type { StripeObject } from './state';

export interface ConnectedAccount extends StripeObject {
  object: 'account';
  capabilities: Record<string, 'active' | 'inactive' | 'pending'>;
  charges_enabled: boolean;
  country: string;
  default_currency: string;
  details_submitted: boolean;
  email: string | null;
  external_accounts: { object: 'list'; data: StripeObject[]; has_more: boolean; total_count: number; url: string };
  payouts_enabled: boolean;
  requirements: Record<string, unknown>;
}

// What onboarding asks for; the fake's onboarding page stands in for all of it.
const ONBOARDING_REQUIREMENTS = [
  'business_profile.url',
  'business_type',
  'external_account',
  'representative.first_name',
  'representative.last_name',
  'tos_acceptance.date',
  'tos_acceptance.ip',
];

export function onboardingPagePath(token: string): string {
  return `/onboard/${encodeURIComponent(token)}`;
}

export function requirements(due: readonly string[]): Record<string, unknown> {
  return {
    alternatives: [],
    current_deadline: null,
    currently_due: [...due],
    disabled_reason: due.length > 0 ? 'requirements.past_due' : null,
    errors: [],
    eventually_due: [...due],
    past_due: [...due],
    pending_verification: [],
  };
}

export function openRequirements(): Record<string, unknown> {
  return requirements(ONBOARDING_REQUIREMENTS);
}

function bankAccount(account: ConnectedAccount): StripeObject {
  return {
    id: newId('ba'),
    object: 'bank_account',
    account: account.id,
    account_holder_name: null,
    account_holder_type: null,
    account_type: null,
    available_payout_methods: ['standard'],
    bank_name: 'FAKE TEST BANK',
    country: account.country,
    currency: account.default_currency,
    default_for_currency: true,
    fingerprint: randomToken(16),
    last4: '6789',
    metadata: {},
    routing_number: '110000000',
    status: 'new',
  };
}

/** The onboarding page's "Complete onboarding": everything submitted, charges and payouts enabled. */
export function completeOnboarding(context: StripeFakeContext, account: ConnectedAccount): void {
  if (account.details_submitted && account.charges_enabled && account.payouts_enabled) return;
  const previous = {
    capabilities: structuredClone(account.capabilities),
    charges_enabled: account.charges_enabled,
    details_submitted: account.details_submitted,
    payouts_enabled: account.payouts_enabled,
    requirements: structuredClone(account.requirements),
  };
  const bank = account.external_accounts.data[0] ?? bankAccount(account);
  Object.assign(account, {
    capabilities: Object.fromEntries(Object.keys(account.capabilities).map((name) => [name, 'active'])),
    charges_enabled: true,
    details_submitted: true,
    external_accounts: { ...account.external_accounts, data: [bank], total_count: 1 },
    future_requirements: requirements([]),
    payouts_enabled: true,
    requirements: requirements([]),
    tos_acceptance: { date: unixSeconds(), ip: '127.0.0.1', user_agent: null },
  });
  context.events.emit('account.updated', account, { account: account.id, previousAttributes: previous });
}
