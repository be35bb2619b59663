import type { APIRequestContext, APIResponse, Browser, Page } from '@playwright/test';
import { mirrorListing } from '../setup/listing-bodies';
import { linkIn, waitForMail } from '../setup/mailbox';
import { test, expect } from './fixtures';
import { E2E_MAIL_DIR, E2E_ORIGIN } from './paths';

// Each payload sets window.__pwned if it ever runs: as a script element, as an event handler, as a link.
const SCRIPT = '<script>window.__pwned=1</script>';
const IMG = '<img src=x onerror="window.__pwned=1">';
const LINK = '[x](javascript:window.__pwned=1)';

const PASSWORD = 'inert-password-1';
const headers = { origin: E2E_ORIGIN };

async function ok(res: Promise<APIResponse>, status: number) {
  const r = await res;
  expect(r.status(), await r.text()).toBe(status);
  return r.json();
}

/** Signs up through the API with the page's own cookie jar, confirms by the mailed link, signs in. */
async function newAccount(request: APIRequestContext, name: string): Promise<string> {
  const email = `inert.${Date.now()}.${Math.random().toString(36).slice(2, 8)}@lab.example`;
  await ok(request.post('/api/auth/sign-up', { data: { email, password: PASSWORD, name }, headers }), 201);
  const token = new URL(linkIn(await waitForMail(E2E_MAIL_DIR, email, /Confirm your e-mail/), '/verify')).searchParams.get('token');
  await ok(request.post('/api/auth/verify', { data: { token }, headers }), 200);
  await ok(request.post('/api/auth/sign-in', { data: { email, password: PASSWORD }, headers }), 200);
  return email;
}

async function signedInPage(browser: Browser, who: string): Promise<Page> {
  const page = await (await browser.newContext()).newPage();
  await ok(
    page.request.post('/api/auth/sign-in', { data: { email: `${who}@demo.lightyard.example`, password: 'demo-password-1' }, headers }),
    200,
  );
  return page;
}

/**
 * Nothing injected ran, and nothing injected became markup: no handler attribute, no javascript: link,
 * no image pointing at "x", no executable script carrying the payload. The DOM checks hold even where a
 * Content-Security-Policy would stop the script from running.
 */
async function expectInert(page: Page) {
  await page.waitForLoadState('networkidle');
  expect(await page.evaluate(() => (window as { __pwned?: unknown }).__pwned)).toBeUndefined();
  expect(await page.locator('img[src="x"], [onerror], a[href^="javascript:" i]').count()).toBe(0);
  const runnable = await page.evaluate(
    () => [...document.scripts].filter((s) => (!s.type || /javascript|module/i.test(s.type)) && s.text.includes('__pwned')).length,
  );
  expect(runnable).toBe(0);
}

test('script and HTML in listing text, lab and display names, questions and reports render as text and never run', async ({
  page,
  browser,
}) => {
  // a dozen page loads and three accounts: more than the default minute on a busy machine
  test.setTimeout(180_000);
  const stamp = `inert${Date.now()}`;
  const title = `Mirror ${stamp} ${SCRIPT} ${IMG}`;
  const description = `Plain words about ${stamp}. ${SCRIPT} ${IMG} ${LINK} <a href="javascript:window.__pwned=1">click</a>`;
  const sellerName = `Eve${SCRIPT}${IMG}`;
  const buyerName = `Mallory${IMG}`;
  const labName = `Lab ${stamp} ${SCRIPT}`;
  const question = `${SCRIPT} ${IMG} ${LINK} Is it still in stock?`;
  const reportReason = `Suspicious ${IMG} ${SCRIPT}`;

  // A seller whose name and lab carry markup lists a part whose title and description do too.
  const sellerEmail = await newAccount(page.request, sellerName);
  await ok(page.request.post('/api/labs', { data: { name: labName, institute: `Institute ${IMG}`, country: 'NL' }, headers }), 201);
  const { id } = await ok(
    page.request.post('/api/listings', {
      data: mirrorListing(title, { quantity: 2, priceCents: 50_000, description }),
      headers,
    }),
    201,
  );
  await ok(page.request.post(`/api/listings/${id}/submit`, { headers }), 200);

  // The moderator reviews it while it waits, then approves it.
  const moderator = await signedInPage(browser, 'moderator');
  await moderator.goto('/moderation');
  await expect(moderator.getByText(title).first()).toBeVisible();
  await expectInert(moderator);
  await moderator.goto(`/moderation/listings/${id}`);
  await expect(moderator.getByText(title).first()).toBeVisible();
  await expect(moderator.getByText(`Plain words about ${stamp}.`)).toBeVisible();
  await expectInert(moderator);
  await ok(moderator.request.post(`/api/moderation/listings/${id}`, { data: { action: 'approve' }, headers }), 200);

  // A buyer whose name carries markup asks about it and reports it.
  const buyer = await (await browser.newContext()).newPage();
  await newAccount(buyer.request, buyerName);
  const { threadId } = await ok(buyer.request.post(`/api/listings/${id}/questions`, { data: { body: question }, headers }), 201);
  await ok(buyer.request.post(`/api/listings/${id}/reports`, { data: { reason: reportReason }, headers }), 201);

  await buyer.goto(`/listings/${id}`);
  await expect(buyer.getByRole('heading', { name: title })).toBeVisible();
  await expect(buyer.getByText(labName).first()).toBeVisible();
  // the description is Markdown: its markup is dropped and the javascript: link is left as plain text
  await expect(buyer.getByText(`Plain words about ${stamp}.`)).toBeVisible();
  await expectInert(buyer);

  await buyer.goto(`/search?q=${stamp}`);
  await expect(buyer.getByText(title).first()).toBeVisible();
  await expectInert(buyer);

  await page.goto('/desk');
  await expect(page.getByText(title).first()).toBeVisible();
  await expectInert(page);

  await page.goto(`/messages/${threadId}`);
  await expect(page.getByText(question)).toBeVisible();
  await expect(page.getByText(buyerName).first()).toBeVisible();
  await expectInert(page);

  await moderator.goto('/moderation');
  await expect(moderator.getByText(reportReason)).toBeVisible();
  await expect(moderator.getByText(buyerName).first()).toBeVisible();
  await expectInert(moderator);

  const admin = await signedInPage(browser, 'admin');
  await admin.goto('/admin');
  // typed before hydration, the search would be reset by React taking over the field
  await expect(admin.locator('astro-island[component-url*="UserRoles"]')).not.toHaveAttribute('ssr');
  await admin.getByLabel('Find people').fill(sellerEmail);
  await expect(admin.getByText(sellerName)).toBeVisible();
  await expectInert(admin);
});
