import type { APIRequestContext, Locator, Page } from '@playwright/test';
import { request as playwrightRequest } from '@playwright/test';
import { mailTo, waitForMail } from '../setup/mailbox';
import { expect, test } from './fixtures';
import { E2E_MAIL_DIR, E2E_ORIGIN } from './paths';

const PASSWORD = 'demo-password-1';
const BUYER = 'buyer@demo.lightyard.example';

/** Islands hydrate on load; typing before that would be undone by hydration. */
async function hydrated(inside: Locator) {
  await expect(inside.locator('xpath=ancestor::astro-island[1]')).not.toHaveAttribute('ssr');
}

/** The buyer's goal: finesse 100 000 at 780 nm in a 50 mm cavity, a pair from one listing. */
async function askForFinesse(page: Page) {
  await page.goto('/search');
  const form = page.getByRole('search', { name: 'Goal search' });
  await hydrated(form);
  await form.getByRole('button', { name: 'Cavity' }).click();
  await form.getByLabel('Wavelength', { exact: true }).fill('780');
  await form.getByLabel('Goal', { exact: true }).selectOption('finesse');
  await form.getByLabel('Finesse', { exact: true }).fill('100 000');
  await form.getByLabel('Cavity length').fill('50');
  await form.getByLabel('Mirrors').selectOption('pair');
  await form.getByRole('button', { name: 'Find parts that fit' }).click();
  await expect(page).toHaveURL(/mode=cavity&wl=780&target=finesse&finesse=100\+000&len=50&config=pair/);
}

async function apiAs(email: string): Promise<APIRequestContext> {
  const ctx = await playwrightRequest.newContext({ baseURL: E2E_ORIGIN, extraHTTPHeaders: { origin: E2E_ORIGIN } });
  expect((await ctx.post('/api/auth/sign-in', { data: { email, password: PASSWORD } })).status()).toBe(200);
  return ctx;
}

test('finesse 100 000 at 780 nm in 50 mm: a demo mirror pair that reaches it ranks first, with its headroom', async ({ page }) => {
  await askForFinesse(page);
  const first = page.getByTestId('result').first();
  await expect(first).toHaveAttribute('data-verdict', 'fits');
  await expect(first.getByTestId('result-title')).toContainText('780 nm');
  await expect(first.getByTestId('headroom-chip')).toHaveText(/fits · headroom \+\d/);
  await expect(first.getByTestId('fit-figure')).toBeVisible();
});

test('the buyer’s goal search: out of band is not a fit, the query lives in the address, a saved search mails one new fit', async ({
  page,
}) => {
  await askForFinesse(page);
  await expect(page.getByTestId('headline')).toContainText('Each mirror of the pair: T + loss at most');

  const oob = page
    .getByTestId('result')
    .filter({ has: page.getByRole('link', { name: '852 nm low-loss mirror, ROC 50 mm', exact: true }) });
  await expect(oob).toHaveAttribute('data-verdict', 'does-not-fit');
  await expect(oob.getByTestId('headroom-chip')).toHaveText(/out of band/);
  await expect(oob).toContainText('out of band: coating band 830–875 nm does not cover 780 nm');
  await expect(oob.getByTestId('fit-verdict')).not.toContainText('Fits');
  await expect(page.getByTestId('result').first().getByTestId('plot').locator('canvas')).toHaveCount(1);

  // a filter goes into the address; the back button brings the previous search back
  const all = await page.getByTestId('result').count();
  await page.getByLabel('New in package').check();
  await expect(page).toHaveURL(/condition=new/);
  await expect(page.getByTestId('result')).not.toHaveCount(all);
  await page.goBack();
  await expect(page).not.toHaveURL(/condition=new/);
  await expect(page.getByLabel('New in package')).not.toBeChecked();
  await expect(page.getByTestId('result')).toHaveCount(all);

  // the address alone reproduces the search
  const address = page.url();
  await page.goto(address);
  await expect(page.getByRole('search', { name: 'Goal search' }).getByLabel('Finesse', { exact: true })).toHaveValue('100 000');
  await expect(page.getByTestId('result')).toHaveCount(all);

  await page.getByRole('link', { name: 'Sign in to save this search' }).click();
  await page.getByLabel('E-mail address').fill(BUYER);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/search\?mode=cavity/);
  await hydrated(page.getByRole('search', { name: 'Goal search' }));
  await page.getByRole('button', { name: 'Save this search' }).click();
  const name = `Finesse 100 000 at 780 nm (${Date.now()})`;
  await page.getByLabel('Name of the saved search').fill(name);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await expect(page.getByTestId('saved')).toBeVisible();

  // a lab lists a fitting pair; a moderator approves it
  const seller = await apiAs('seller@demo.lightyard.example');
  const moderator = await apiAs('moderator@demo.lightyard.example');
  const created = await seller.post('/api/listings', {
    data: {
      category: 'cavity-mirror',
      title: 'Matched pair of 780 nm supermirrors, ROC 100 mm, fresh coating run',
      description: 'Two mirrors from one coating run.',
      condition: 'new',
      quantity: 2,
      priceCents: 210_000,
      currency: 'EUR',
      shipsTo: ['EU', 'UK', 'US', 'CA'],
      specs: {
        diameterMm: 7.75,
        substrate: 'fused silica',
        rocMm: 100,
        designWavelengthNm: 780,
        bandMinNm: 760,
        bandMaxNm: 800,
        transmissionPpm: { value: 2, tol: 0.4 },
        lossPpm: { value: 1, tol: 0.3 },
        aoiDeg: 0,
      },
    },
  });
  expect(created.status()).toBe(201);
  const { id } = (await created.json()) as { id: string };
  expect((await seller.post(`/api/listings/${id}/submit`)).status()).toBe(200);
  expect((await moderator.post(`/api/moderation/listings/${id}`, { data: { action: 'approve' } })).status()).toBe(200);

  const mail = await waitForMail(E2E_MAIL_DIR, BUYER, new RegExp(`^New fit for “${name.replace(/[()]/g, '\\$&')}”`));
  expect(mail.text).toContain(`/listings/${id}`);
  expect(mail.text).toMatch(/Predicted finesse: \d/);
  await page.waitForTimeout(2500);
  expect((await mailTo(E2E_MAIL_DIR, BUYER)).filter((m) => m.subject.includes(name))).toHaveLength(1);

  // the new pair is in the results at once, first, with its headroom
  await page.reload();
  const first = page.getByTestId('result').first();
  await expect(first).toHaveAttribute('data-listing', id);
  await expect(first.getByTestId('headroom-chip')).toHaveText(/fits · headroom \+\d/);
  await seller.dispose();
  await moderator.dispose();
});

test('the header’s search field lands on the search page with its words, and the cards link to the listings', async ({ page }) => {
  await page.goto('/');
  await page.getByRole('searchbox', { name: 'Search listings' }).fill('1550 supermirror');
  await page.getByRole('searchbox', { name: 'Search listings' }).press('Enter');
  await expect(page).toHaveURL(/\/search\?q=1550\+supermirror$/);
  const cards = page.getByTestId('listing-card');
  await expect(cards).toHaveCount(2);
  await expect(cards.first()).toContainText(/1550 nm supermirror/);
  await expect(page.getByRole('search', { name: 'Goal search' }).getByLabel('Words')).toHaveValue('1550 supermirror');
  await cards.first().click();
  await expect(page).toHaveURL(/\/listings\/[^/]+$/);
  await expect(page.getByTestId('listing-title')).toContainText('1550 nm supermirror');
});
