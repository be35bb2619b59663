import type { Page } from '@playwright/test';
import sharp from 'sharp';
import { test, expect } from './fixtures';

const TAU_US = 20;
const LENGTH_M = 0.05;

/** Islands hydrate on load; typing before that would be undone by hydration. */
async function hydrated(page: Page, component: string) {
  await expect(page.locator(`astro-island[component-url*="${component}"]`)).not.toHaveAttribute('ssr');
}

async function signIn(page: Page, next: string) {
  await signInAs(page, 'seller', next);
}

async function signInAs(page: Page, who: string, next: string) {
  await page.goto(`/sign-in?next=${encodeURIComponent(next)}`);
  await page.getByLabel('E-mail address').fill(`${who}@demo.lightyard.example`);
  await page.getByLabel('Password').fill('demo-password-1');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(new RegExp(`${next}$`));
}

/** A ring-down trace I(t) = exp(−t/τ) + 1 % Gaussian noise (deterministic), in the parser's header format. */
function ringdownCsv(): string {
  let seed = 7;
  const uniform = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return (seed + 1) / 2147483649;
  };
  const gauss = () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
  const lines = [`# length_m=${LENGTH_M}`, '# wavelength_nm=780', 'time_us,intensity'];
  for (let i = 0; i < 800; i++) {
    const t = i * 0.2;
    lines.push(`${t.toFixed(2)},${(Math.exp(-t / TAU_US) + 0.01 * gauss()).toFixed(6)}`);
  }
  return lines.join('\n') + '\n';
}

const MINIMAL_PDF =
  '%PDF-1.4\n1 0 obj <</Type /Catalog /Pages 2 0 R>> endobj\n2 0 obj <</Type /Pages /Kids [] /Count 0>> endobj\ntrailer <</Root 1 0 R>>\n%%EOF\n';

test('the demo seller lists a cavity mirror with a photo, a datasheet and a ring-down trace; a moderator approves it; only its lab may edit it', async ({
  page,
  browser,
}) => {
  const title = `E2E supermirror 780 nm ${Date.now()}`;
  await signIn(page, '/desk');
  await hydrated(page, 'SellerDesk');
  await page.getByRole('link', { name: 'New listing' }).click();
  await expect(page).toHaveURL(/\/desk\/listings\/new$/);
  await hydrated(page, 'ListingEditor');

  // Step 1: basics
  await page.getByLabel('Category', { exact: true }).selectOption({ label: 'Cavity mirror' });
  await page.getByLabel('Title', { exact: true }).fill(title);
  await page.getByLabel('Description (optional)', { exact: true }).fill('Spare from our **science cavity**; measured before removal.');
  await page.getByLabel('Condition', { exact: true }).selectOption({ label: 'Used and tested (with data)' });
  await page.getByLabel('Quantity', { exact: true }).fill('2');
  await page.getByLabel('Price per unit', { exact: true }).fill('1250.50');
  await page.getByLabel('Currency', { exact: true }).selectOption('EUR');
  await page.getByLabel('European Union').check();
  await page.getByLabel('United Kingdom').check();
  await page.getByRole('button', { name: 'Next: Specs' }).click();

  // Step 2: specs, first with transmission + loss above 100 %
  await expect(page.getByRole('heading', { name: /Specifications/ })).toBeFocused();
  await page.getByLabel('Diameter', { exact: true }).fill('25.4');
  await page.getByLabel('Substrate', { exact: true }).fill('fused silica');
  await page.getByLabel('Radius of curvature', { exact: true }).fill('50');
  await page.getByLabel('Design wavelength', { exact: true }).fill('780');
  await page.getByLabel('Coating band from', { exact: true }).fill('760');
  await page.getByLabel('Coating band to', { exact: true }).fill('800');
  await page.getByLabel('Transmission', { exact: true }).fill('60');
  await page.getByLabel('Transmission unit').selectOption('pct');
  await page.getByLabel('Loss (absorption + scatter)', { exact: true }).fill('50');
  await page.getByLabel('Loss (absorption + scatter) unit').selectOption('pct');
  await page.getByLabel('Angle of incidence', { exact: true }).fill('0');
  await page.getByRole('button', { name: 'Next: Files' }).click();
  await expect(page.getByText(/Transmission \+ loss is 1100000 ppm: it must stay below/).first()).toBeVisible();
  await expect(page.getByLabel('Transmission', { exact: true })).toHaveAttribute('aria-invalid', 'true');
  await expect(page.getByTestId('editor-status')).toHaveText('Not saved yet');
  // nothing typed is lost, on this step or the one before
  await expect(page.getByLabel('Diameter', { exact: true })).toHaveValue('25.4');
  await expect(page.getByLabel('Transmission', { exact: true })).toHaveValue('60');
  await page.getByRole('button', { name: 'Back' }).click();
  await expect(page.getByLabel('Title', { exact: true })).toHaveValue(title);
  await expect(page.getByLabel('Price per unit', { exact: true })).toHaveValue('1250.50');
  await page.getByRole('button', { name: 'Next: Specs' }).click();
  await expect(page.getByLabel('Coating band to', { exact: true })).toHaveValue('800');

  await page.getByLabel('Transmission unit').selectOption('ppm');
  await page.getByLabel('Transmission', { exact: true }).fill('2');
  await page.getByLabel('Transmission tolerance (±)').fill('0.5');
  await page.getByLabel('Loss (absorption + scatter) unit').selectOption('ppm');
  await page.getByLabel('Loss (absorption + scatter)', { exact: true }).fill('8');
  await page.getByLabel('Loss (absorption + scatter) tolerance (±)').fill('2');
  await page.getByRole('button', { name: 'Next: Files' }).click();

  // Step 3: the draft is saved first, then files upload
  await expect(page.getByText('Saved as a draft. You can add files now.')).toBeVisible();
  await expect(page).toHaveURL(/\/desk\/listings\/[^/]+$/);
  await expect(page.getByTestId('editor-status')).toHaveText('Draft');

  // Hold the photo's PUT to storage so that its progress bar can be seen.
  let release: () => void = () => undefined;
  const held = new Promise<void>((r) => (release = r));
  await page.route(
    (url) => url.pathname.endsWith('/original') && url.pathname.includes('/listings/'),
    async (route) => {
      if (route.request().method() === 'PUT') await held;
      await route.continue();
    },
  );
  const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 40, g: 90, b: 140 } } })
    .png()
    .toBuffer();
  await page.getByLabel('Add photos').setInputFiles({ name: 'mirror.png', mimeType: 'image/png', buffer: png });
  const photo = page.getByTestId('upload-item').filter({ hasText: 'mirror.png' });
  await expect(photo.getByRole('progressbar', { name: 'Uploading mirror.png' })).toBeVisible();
  release();
  await expect(photo.getByTestId('upload-ready')).toBeVisible();
  await expect(photo.getByRole('img', { name: 'Photo mirror.png' })).toBeVisible();
  await expect.poll(() => photo.getByRole('img').evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(0);
  await page.unrouteAll();

  await page
    .getByLabel('Add a datasheet (PDF)')
    .setInputFiles({ name: 'coating-datasheet.pdf', mimeType: 'application/pdf', buffer: Buffer.from(MINIMAL_PDF) });
  await expect(page.getByTestId('upload-item').filter({ hasText: 'coating-datasheet.pdf' }).getByTestId('upload-ready')).toBeVisible();

  await page.getByLabel('Measurement kind').selectOption({ label: 'Cavity ring-down trace' });
  await page
    .getByLabel('Add a measurement CSV')
    .setInputFiles({ name: 'ringdown.csv', mimeType: 'text/csv', buffer: Buffer.from(ringdownCsv()) });
  const trace = page.getByTestId('upload-item').filter({ hasText: 'ringdown.csv' });
  await expect(trace.getByTestId('upload-ready')).toBeVisible();
  await expect(trace.getByTestId('plot').locator('canvas')).toHaveCount(1);
  const tauText = (await trace.getByTestId('ringdown-tau').textContent()) ?? '';
  expect(tauText).toMatch(/^[\d.]+\u2009µs$/);
  expect(Math.abs(Number.parseFloat(tauText) - TAU_US) / TAU_US).toBeLessThan(0.01);
  await expect(trace.getByTestId('measurement-ringdown')).toContainText(/τ = [\d.]+\u2009µs ± [\d.]+\u2009[nµ]s \(2σ\)/);
  // F = 2π·FSR·τ = 2π·(c/2L)·τ for L = 5 cm (physics.md A1 form 1.10): about 377 000
  await expect(trace.getByTestId('ringdown-finesse')).toHaveText(/^3[67]\d\u2009\d{3}$/);

  // Step 4: preview as a buyer reads it, then submit
  await page.getByRole('button', { name: 'Next: Preview' }).click();
  const preview = page.getByTestId('listing-preview');
  await expect(preview.getByRole('heading', { name: title })).toBeVisible();
  await expect(preview.getByTestId('preview-price')).toHaveText('€1,250.50');
  await expect(preview.getByText('European Union, United Kingdom')).toBeVisible();
  await expect(preview.getByTestId('preview-specs').getByRole('row', { name: /Transmission/ })).toContainText('2 ± 0.5\u2009ppm');
  await expect(preview.getByTestId('preview-specs').getByRole('row', { name: /Coating band/ })).toContainText('760–800\u2009nm');
  await expect(preview.getByTestId('measurement-ringdown')).toBeVisible();
  await expect(preview.locator('strong', { hasText: 'science cavity' })).toBeVisible();
  await page.getByRole('button', { name: 'Submit for review' }).click();

  await expect(page).toHaveURL(/\/desk\?submitted=/);
  await expect(page.getByText(`Submitted “${title}” for review.`)).toBeVisible();
  await hydrated(page, 'SellerDesk');
  const row = page.locator(`tr[data-listing="${title}"]`);
  await expect(row.getByTestId('status')).toHaveText('In review');

  // Stock changes inline without leaving the desk.
  await row.getByRole('spinbutton', { name: `Stock of ${title}` }).fill('3');
  await row.getByRole('button', { name: 'Set' }).click();
  await expect(row.getByText('Saved')).toBeVisible();
  await page.reload();
  await expect(page.locator(`tr[data-listing="${title}"]`).getByRole('spinbutton', { name: `Stock of ${title}` })).toHaveValue('3');

  // The moderator approves it from the review queue; it goes live with its measured finesse.
  const href = await page.locator(`tr[data-listing="${title}"]`).getByRole('link', { name: 'Edit' }).getAttribute('href');
  const listingId = href!.split('/').pop()!;
  const modCtx = await browser.newContext();
  const mod = await modCtx.newPage();
  await signInAs(mod, 'moderator', '/moderation');
  await mod.getByRole('link', { name: title }).click();
  await hydrated(mod, 'ModerationPanel');
  await mod.getByRole('button', { name: 'Approve' }).click();
  await expect(mod).toHaveURL(/\/moderation$/);
  await expect(mod.getByRole('link', { name: title })).toHaveCount(0);
  await modCtx.close();

  const anonCtx = await browser.newContext();
  const anon = await anonCtx.newPage();
  await anon.goto(`/listings/${listingId}`);
  await expect(anon.getByTestId('listing-title')).toHaveText(title);
  await anon.getByTestId('measurement-ringdown').scrollIntoViewIfNeeded();
  await expect(anon.getByTestId('ringdown-finesse')).toHaveText(/^3[67]\d\u2009\d{3}$/);
  await anonCtx.close();

  // Neither a buyer nor the owner of another lab may edit it.
  for (const who of ['buyer', 'seller2']) {
    const ctx = await browser.newContext();
    const other = await ctx.newPage();
    await signInAs(other, who, '/account');
    const r = await other.request.patch(`/api/listings/${listingId}`, { data: { priceCents: 1 } });
    expect(r.status()).toBe(403);
    await ctx.close();
  }
});

test('the desk sorts, filters and searches, duplicates a listing and archives it after a confirmation', async ({ page }) => {
  await signIn(page, '/desk');
  await hydrated(page, 'SellerDesk');
  const rows = page.locator('tbody tr[data-listing]');
  await expect(rows.first()).toBeVisible();

  await page.getByLabel('Status').selectOption('in-review');
  for (const s of await rows.getByTestId('status').allTextContents()) expect(s).toBe('In review');
  await page.getByLabel('Status').selectOption('active');

  await page.getByRole('button', { name: /^Listing/ }).click();
  await expect(page.getByRole('columnheader', { name: /Listing/ })).toHaveAttribute('aria-sort', 'ascending');
  const titles = await rows.evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-listing') ?? ''));
  expect(titles).toEqual([...titles].sort((a, b) => a.localeCompare(b, undefined, { numeric: true, sensitivity: 'base' })));

  const original = titles[0]!;
  await page.getByLabel('Search your listings').fill(original);
  await expect(rows).toHaveCount(1);
  await rows
    .first()
    .getByRole('button', { name: `Duplicate ${original}` })
    .click();
  await expect(page.getByText(`Copied “${original}” as a new draft.`)).toBeVisible();

  const copyTitle = `${original} (copy)`.slice(0, 140);
  await page.getByLabel('Search your listings').fill('(copy)');
  const copy = page.locator(`tr[data-listing="${copyTitle}"]`);
  await expect(copy.getByTestId('status')).toHaveText('Draft');
  await copy.getByRole('button', { name: `Archive ${copyTitle}` }).click();
  await expect(copy.getByRole('button', { name: 'Yes, archive' })).toBeFocused();
  await page.keyboard.press('Enter');
  await expect(page.getByText(`Archived “${copyTitle}”.`)).toBeVisible();
  await expect(copy).toHaveCount(0);
  await page.getByLabel('Status').selectOption('archived');
  await expect(copy.getByTestId('status')).toHaveText('Archived');
});
