import { describe, expect, test } from 'vitest';
import { checkCard, TEST_CARDS } from '../../../fakes/stripe/cards';
import { StripeFakeError } from '../../../fakes/stripe/errors';

const NOW = new Date('2026-12-01T12:00:00Z');

function refusal(run: () => unknown): StripeFakeError {
  try {
    run();
  } catch (error) {
    if (error instanceof StripeFakeError) return error;
    throw error;
  }
  throw new Error('expected the card to be refused');
}

describe('payments fake: test cards', () => {
  test('each listed card has its behaviour, with spaces and dashes ignored', () => {
    expect(checkCard({ number: '4242 4242 4242 4242' }, NOW)).toMatchObject({
      behaviour: { kind: 'succeed' },
      brand: 'visa',
      last4: '4242',
    });
    expect(checkCard({ number: '5555-5555-5555-4444' }, NOW)).toMatchObject({ behaviour: { kind: 'succeed' }, brand: 'mastercard' });
    expect(checkCard({ number: '4000000000000002' }, NOW).behaviour).toEqual({
      kind: 'decline',
      declineCode: 'generic_decline',
      message: 'Your card was declined.',
    });
    expect(checkCard({ number: '4000002500003155' }, NOW).behaviour).toEqual({ kind: 'authenticate' });
    for (const card of TEST_CARDS) expect(() => checkCard({ number: card.number }, NOW)).not.toThrow();
  });

  test('a valid number that is not a test card is declined as a live card in test mode', () => {
    expect(checkCard({ number: '4111111111111111' }, NOW).behaviour).toMatchObject({ kind: 'decline', declineCode: 'test_mode_live_card' });
  });

  test('the same number always has the same fingerprint; another number another one', () => {
    const first = checkCard({ number: '4242424242424242' }, NOW).fingerprint;
    expect(checkCard({ number: '4242 4242 4242 4242' }, NOW).fingerprint).toBe(first);
    expect(checkCard({ number: '5555555555554444' }, NOW).fingerprint).not.toBe(first);
  });

  test('refuses a mistyped number, a past or impossible expiry and a malformed code as card errors', () => {
    const mistyped = refusal(() => checkCard({ number: '4242424242424241' }, NOW));
    expect(mistyped.status).toBe(402);
    expect(mistyped.body).toMatchObject({ type: 'card_error', code: 'incorrect_number', message: 'Your card number is incorrect.' });
    expect(refusal(() => checkCard({ number: '4242' }, NOW)).body.code).toBe('incorrect_number');
    expect(refusal(() => checkCard({ number: '4242424242424242', expMonth: 11, expYear: 2026 }, NOW)).body.code).toBe(
      'invalid_expiry_year',
    );
    expect(refusal(() => checkCard({ number: '4242424242424242', expMonth: 13, expYear: 2030 }, NOW)).body.code).toBe(
      'invalid_expiry_month',
    );
    expect(refusal(() => checkCard({ number: '4242424242424242', cvc: '12a' }, NOW)).body.code).toBe('invalid_cvc');
  });

  test('the current month is still valid, and a card without an expiry is taken to be valid', () => {
    expect(checkCard({ number: '4242424242424242', expMonth: 12, expYear: 2026 }, NOW)).toMatchObject({ expMonth: 12, expYear: 2026 });
    expect(checkCard({ number: '4242424242424242' }, NOW)).toMatchObject({ expMonth: 12, expYear: 2029 });
  });
});
