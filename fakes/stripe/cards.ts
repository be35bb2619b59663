import { createHash } from 'node:crypto';
import { cardError } from './errors';

export type CardBehaviour = { kind: 'succeed' } | { kind: 'decline'; declineCode: string; message: string } | { kind: 'authenticate' };

export interface TestCard {
  number: string;
  /** What the card does, in the words the hosted page and the README use. */
  description: string;
  behaviour: CardBehaviour;
}

const DECLINED = 'Your card was declined.';

/** The card numbers the fake knows; any other valid number is declined, as in the provider's test mode. */
export const TEST_CARDS: readonly TestCard[] = [
  { number: '4242424242424242', description: 'succeeds', behaviour: { kind: 'succeed' } },
  { number: '5555555555554444', description: 'succeeds', behaviour: { kind: 'succeed' } },
  {
    number: '4000000000000002',
    description: 'is declined (card_declined)',
    behaviour: { kind: 'decline', declineCode: 'generic_decline', message: DECLINED },
  },
  {
    number: '4000000000009995',
    description: 'is declined for insufficient funds',
    behaviour: { kind: 'decline', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.' },
  },
  {
    number: '4000002500003155',
    description: 'asks for an extra confirmation step first',
    behaviour: { kind: 'authenticate' },
  },
];

const NOT_A_TEST_CARD: CardBehaviour = {
  kind: 'decline',
  declineCode: 'test_mode_live_card',
  message:
    'Your card was declined. Your request was in test mode, but used a non test (live) card. For a list of valid test cards, visit: https://stripe.com/docs/testing.',
};

export interface CardEntry {
  number: string;
  expMonth?: number;
  expYear?: number;
  cvc?: string;
}

export interface CheckedCard {
  behaviour: CardBehaviour;
  brand: string;
  last4: string;
  expMonth: number;
  expYear: number;
  fingerprint: string;
}

function passesLuhn(digits: string): boolean {
  let sum = 0;
  for (let index = 0; index < digits.length; index += 1) {
    let digit = Number(digits[digits.length - 1 - index]);
    if (index % 2 === 1) {
      digit *= 2;
      if (digit > 9) digit -= 9;
    }
    sum += digit;
  }
  return sum % 10 === 0;
}

function brandOf(digits: string): string {
  if (digits.startsWith('4')) return 'visa';
  if (/^(5[1-5]|2[2-7])/.test(digits)) return 'mastercard';
  if (/^3[47]/.test(digits)) return 'amex';
  return 'unknown';
}

function fingerprintOf(digits: string): string {
  return createHash('sha256').update(digits).digest('base64url').replace(/[-_]/g, '').slice(0, 16);
}

/**
 * What the card form checks before anything is charged: the number, expiry and security code.
 * These refusals leave no PaymentIntent behind; the test card's behaviour decides the rest.
 * Without an expiry (the test-only pay route) the card is taken to be valid for a few years.
 */
export function checkCard(entry: CardEntry, now = new Date()): CheckedCard {
  const digits = entry.number.replace(/[\s-]/g, '');
  if (!/^\d{12,19}$/.test(digits) || !passesLuhn(digits)) {
    throw cardError({ code: 'incorrect_number', message: 'Your card number is incorrect.', param: 'number' });
  }
  const expMonth = entry.expMonth ?? 12;
  const expYear = entry.expYear ?? now.getUTCFullYear() + 3;
  if (!Number.isInteger(expMonth) || expMonth < 1 || expMonth > 12) {
    throw cardError({ code: 'invalid_expiry_month', message: "Your card's expiration month is invalid.", param: 'exp_month' });
  }
  const monthsNow = now.getUTCFullYear() * 12 + now.getUTCMonth();
  if (!Number.isInteger(expYear) || expYear * 12 + expMonth - 1 < monthsNow) {
    throw cardError({ code: 'invalid_expiry_year', message: "Your card's expiration year is in the past.", param: 'exp_year' });
  }
  if (entry.cvc !== undefined && !/^\d{3,4}$/.test(entry.cvc)) {
    throw cardError({ code: 'invalid_cvc', message: "Your card's security code is invalid.", param: 'cvc' });
  }
  return {
    behaviour: TEST_CARDS.find((card) => card.number === digits)?.behaviour ?? NOT_A_TEST_CARD,
    brand: brandOf(digits),
    last4: digits.slice(-4),
    expMonth,
    expYear,
    fingerprint: fingerprintOf(digits),
  };
}
