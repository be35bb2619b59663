import type { ServerResponse } from 'node:http';
import { TEST_CARDS, type CardEntry } from '../cards';
import {
  authenticationPagePath,
  expireIfDue,
  finishAuthentication,
  lineItemsOf,
  payCheckoutSession,
  payPagePath,
  pendingAuthentication,
  successRedirect,
  type CheckoutSession,
  type PaymentAttempt,
} from '../checkout';
import type { StripeFakeContext } from '../context';
import { StripeFakeError } from '../errors';
import { formatAmount } from '../money';
import { html, redirect, sendPage, type Html } from './layout';

interface FormValues {
  email: string;
  name: string;
  number: string;
  expiry: string;
}

function summary(context: StripeFakeContext, session: CheckoutSession): Html {
  const rows = lineItemsOf(context.state, session.id).map(
    (item) =>
      html`<tr>
        <td>${String(item.description)} × ${Number(item.quantity)}</td>
        <td class="amount">${formatAmount(Number(item.amount_total), session.currency)}</td>
      </tr>`,
  );
  return html`<table>
    ${rows}
    <tr class="total">
      <td>Total</td>
      <td class="amount">${formatAmount(session.amount_total, session.currency)}</td>
    </tr>
  </table>`;
}

function cancelLink(session: CheckoutSession): Html {
  return session.cancel_url ? html`<p class="note"><a href="${session.cancel_url}">Cancel and return to the shop</a></p>` : html``;
}

function testCardNote(): Html {
  const items = TEST_CARDS.map((card) => html`<li><code>${card.number}</code> ${card.description}</li>`);
  return html`<details class="note">
    <summary>Test cards</summary>
    <ul>
      ${items}
    </ul>
    <p>Any future expiry date and any three digits as the code.</p>
  </details>`;
}

function payForm(context: StripeFakeContext, session: CheckoutSession, values: FormValues, error?: string): Html {
  const closes = new Date(session.expires_at * 1000).toISOString().replace('T', ' ').slice(0, 16);
  return html`<h1>Pay for your order</h1>
    ${summary(context, session)} ${error ? html`<div class="error" role="alert">${error}</div>` : html``}
    <form method="post" action="${payPagePath(session.id)}">
      <label for="email">E-mail</label>
      <input
        id="email"
        name="email"
        type="email"
        autocomplete="email"
        value="${values.email}"
        ${session.customer_email ? html`readonly` : html``}
      />
      <label for="name">Name on the card</label>
      <input id="name" name="name" autocomplete="cc-name" value="${values.name}" />
      <label for="card_number">Card number</label>
      <input
        id="card_number"
        name="card_number"
        inputmode="numeric"
        autocomplete="cc-number"
        placeholder="4242 4242 4242 4242"
        required
        value="${values.number}"
      />
      <div class="row">
        <div>
          <label for="expiry">Expiry (MM / YY)</label
          ><input id="expiry" name="expiry" autocomplete="cc-exp" placeholder="12 / 34" value="${values.expiry}" />
        </div>
        <div>
          <label for="cvc">Security code</label><input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" placeholder="123" />
        </div>
      </div>
      <button type="submit">Pay ${formatAmount(session.amount_total, session.currency)}</button>
    </form>
    <p class="note">This checkout closes at ${closes} UTC.</p>
    ${testCardNote()} ${cancelLink(session)}`;
}

function authenticationForm(session: CheckoutSession): Html {
  return html`<h1>Confirm this payment</h1>
    <p>
      The card asks for one more check before ${formatAmount(session.amount_total, session.currency)} can be charged. This page stands in
      for the card issuer's check.
    </p>
    <form method="post" action="${authenticationPagePath(session.id)}">
      <button type="submit" name="result" value="complete">Complete authentication</button>
      <button type="submit" name="result" value="fail" class="secondary">Fail authentication</button>
    </form>`;
}

/** An expired session is 410 Gone; a paid one answers `paidStatus` (200 to look at, 409 to pay again). */
function closedPage(response: ServerResponse, session: CheckoutSession, paidStatus: 200 | 409): void {
  if (session.status === 'expired') {
    sendPage(
      response,
      410,
      'Checkout expired',
      html`<h1>This checkout has expired</h1>
        <p>It can no longer be paid. Start again from the shop to place the order.</p>
        ${cancelLink(session)}`,
    );
    return;
  }
  const next = successRedirect(session);
  sendPage(
    response,
    paidStatus,
    'Checkout paid',
    html`<h1>This checkout is paid</h1>
      <p>Thank you: the payment has gone through.</p>
      ${next ? html`<p><a href="${next}">Continue to the shop</a></p>` : html``}`,
  );
}

function emptyValues(session: CheckoutSession): FormValues {
  return { email: session.customer_email ?? '', name: '', number: '', expiry: '' };
}

/** `MM / YY` or `MM/YYYY`; anything else becomes a month the card check refuses. */
function expiryOf(text: string): Pick<CardEntry, 'expMonth' | 'expYear'> {
  if (text.trim() === '') return {};
  const match = /^(\d{1,2})\s*\/\s*(\d{2}|\d{4})$/.exec(text.trim());
  if (!match) return { expMonth: Number.NaN };
  const year = Number(match[2]);
  return { expMonth: Number(match[1]), expYear: year < 100 ? 2000 + year : year };
}

function answerAttempt(response: ServerResponse, context: StripeFakeContext, attempt: PaymentAttempt, values: FormValues): void {
  const { session } = attempt;
  switch (attempt.outcome) {
    case 'succeeded': {
      const next = successRedirect(session);
      if (next) redirect(response, next);
      else closedPage(response, session, 200);
      return;
    }
    case 'requires_action':
      redirect(response, authenticationPagePath(session.id));
      return;
    case 'failed':
      sendPage(response, 402, 'Payment failed', payForm(context, session, values, attempt.error.message));
  }
}

/** A closed session's refusal (410 expired, 409 paid) as a page rather than an API error. */
function refusedAsPage(response: ServerResponse, session: CheckoutSession, run: () => void): void {
  try {
    run();
  } catch (error) {
    if (!(error instanceof StripeFakeError) || (error.status !== 409 && error.status !== 410)) throw error;
    if (session.status === 'open') redirect(response, payPagePath(session.id));
    else closedPage(response, session, 409);
  }
}

export function showPayPage(response: ServerResponse, context: StripeFakeContext, session: CheckoutSession): void {
  expireIfDue(context, session);
  if (session.status === 'open') sendPage(response, 200, 'Test checkout', payForm(context, session, emptyValues(session)));
  else closedPage(response, session, 200);
}

export function submitPayPage(response: ServerResponse, context: StripeFakeContext, session: CheckoutSession, form: URLSearchParams): void {
  const values: FormValues = {
    email: session.customer_email ?? form.get('email')?.trim() ?? '',
    name: form.get('name')?.trim() ?? '',
    number: form.get('card_number')?.trim() ?? '',
    expiry: form.get('expiry')?.trim() ?? '',
  };
  const cvc = form.get('cvc')?.trim();
  refusedAsPage(response, session, () => {
    const attempt = payCheckoutSession(context, session, {
      number: values.number,
      ...expiryOf(values.expiry),
      cvc: cvc === '' ? undefined : cvc,
      name: values.name === '' ? undefined : values.name,
      email: values.email === '' ? undefined : values.email,
    });
    answerAttempt(response, context, attempt, { ...values, number: '' });
  });
}

export function showAuthenticationPage(response: ServerResponse, context: StripeFakeContext, session: CheckoutSession): void {
  if (session.status === 'open' && pendingAuthentication(context, session)) {
    sendPage(response, 200, 'Confirm payment', authenticationForm(session));
    return;
  }
  redirect(response, payPagePath(session.id));
}

export function submitAuthenticationPage(
  response: ServerResponse,
  context: StripeFakeContext,
  session: CheckoutSession,
  form: URLSearchParams,
): void {
  if (session.status === 'open' && !pendingAuthentication(context, session)) {
    redirect(response, payPagePath(session.id));
    return;
  }
  refusedAsPage(response, session, () => {
    const attempt = finishAuthentication(context, session, form.get('result') === 'complete');
    answerAttempt(response, context, attempt, emptyValues(session));
  });
}
