import type { IncomingMessage, ServerResponse } from 'node:http';
import type { CheckoutSession } from '../checkout';
import type { StripeFakeContext } from '../context';
import { readBody } from '../handle-request';
import { showAuthenticationPage, showPayPage, submitAuthenticationPage, submitPayPage } from './checkout-pages';
import { html, sendPage } from './layout';
import { showOnboardingPage, submitOnboardingPage } from './onboarding-pages';

const PAY = /^\/pay\/([^/]+)$/;
const AUTHENTICATE = /^\/pay\/([^/]+)\/authenticate$/;
const ONBOARD = /^\/onboard\/([^/]+)$/;

function decoded(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment;
  }
}

function notFound(response: ServerResponse, what: string): void {
  sendPage(
    response,
    404,
    'Not found',
    html`<h1>No such ${what}</h1>
      <p>The link may be mistyped, or it belongs to another copy of the payments fake.</p>`,
  );
}

function methodNotAllowed(response: ServerResponse): void {
  response.writeHead(405, { Allow: 'GET, POST', 'Content-Length': 0 });
  response.end();
}

/**
 * The pages a browser sees on the fake: the hosted pay page (and its confirmation step) at a
 * session's `url`, and the onboarding page at an account link's `url`. Returns false for any
 * other path, which is then an API request.
 */
export function createPageHandler(context: StripeFakeContext): (request: IncomingMessage, response: ServerResponse) => Promise<boolean> {
  return async (request, response) => {
    const path = new URL(request.url ?? '/', 'http://fake.invalid').pathname;
    const authenticate = AUTHENTICATE.exec(path);
    const sessionId = (authenticate ?? PAY.exec(path))?.[1];
    const token = ONBOARD.exec(path)?.[1];
    if (sessionId === undefined && token === undefined) return false;
    if (request.method !== 'GET' && request.method !== 'POST') {
      methodNotAllowed(response);
      return true;
    }
    const form = request.method === 'POST' ? new URLSearchParams(await readBody(request)) : undefined;

    if (sessionId !== undefined) {
      const session = context.state.get<CheckoutSession>('checkout.session', decoded(sessionId));
      if (!session) notFound(response, 'checkout');
      else if (authenticate && form) submitAuthenticationPage(response, context, session, form);
      else if (authenticate) showAuthenticationPage(response, context, session);
      else if (form) submitPayPage(response, context, session, form);
      else showPayPage(response, context, session);
    } else if (token !== undefined) {
      const link = context.state.accountLinks[decoded(token)];
      if (!link) notFound(response, 'onboarding link');
      else if (form) submitOnboardingPage(response, context, link);
      else showOnboardingPage(response, context, decoded(token), link);
    }
    // A page changes state only when a form is sent; saving then keeps the outcome across a restart.
    if (form) context.state.save();
    return true;
  };
}
