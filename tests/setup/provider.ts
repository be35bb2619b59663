/** Test helpers that play the buyer's and the lab's part on the payment fake's own pages. */
import type { TestApp } from './app';

const fakeBase = (app: TestApp) => `http://127.0.0.1:${app.fakes.ports.stripe}`;

/** Pays a checkout session as the hosted page would (the fake's test-only route). */
export async function payWithCard(app: TestApp, sessionId: string, card: string, authenticate?: boolean) {
  const r = await fetch(`${fakeBase(app)}/_fake/checkout/sessions/${sessionId}/pay`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(authenticate === undefined ? { card } : { card, authenticate }),
  });
  return { status: r.status, body: (await r.json()) as Record<string, unknown> };
}

/** Submits the onboarding page behind an account link, as the lab owner would. */
export async function completeOnboarding(url: string): Promise<void> {
  const page = await (await fetch(url)).text();
  const action = page.match(/<form method="post" action="([^"]+)"/)?.[1];
  if (!action) throw new Error('No onboarding form on the page');
  const r = await fetch(new URL(action.replace(/&amp;/g, '&'), url), {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: '',
  });
  if (r.status >= 400) throw new Error(`Onboarding failed: ${r.status}`);
}

export async function until<T>(what: string, probe: () => Promise<T | null | undefined | false>, timeoutMs = 15_000): Promise<T> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = await probe();
    if (v) return v;
    if (Date.now() > end) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}
