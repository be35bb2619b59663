import type { Page } from '@playwright/test';
import { test, expect } from './fixtures';

async function signIn(page: Page, who: string, next = '/account') {
  await page.goto(`/sign-in?next=${encodeURIComponent(next)}`);
  await page.getByLabel('E-mail address').fill(`${who}@demo.lightyard.example`);
  await page.getByLabel('Password').fill('demo-password-1');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => u.pathname === next);
}

async function hydrated(page: Page, selector: string) {
  await expect(page.locator(`astro-island:has(${selector})`).first()).not.toHaveAttribute('ssr');
}

test('the seller’s story: a buyer pays for the demo mirror pair, the lab ships, the buyer confirms, the lab sees the transfer and a paid payout', async ({
  browser,
}) => {
  test.setTimeout(120_000);
  const sellerCtx = await browser.newContext();
  const seller = await sellerCtx.newPage();
  await signIn(seller, 'seller', '/payouts');
  await seller.getByRole('button', { name: 'Connect payout account' }).click();
  await seller.getByRole('button', { name: 'Complete onboarding' }).click();
  await expect(seller.getByText('Payout account connected.')).toBeVisible();

  const buyerCtx = await browser.newContext();
  const buyer = await buyerCtx.newPage();
  await signIn(buyer, 'buyer', '/search');
  await buyer.goto('/search?q=Matched+pair+780+ROC+1000');
  await buyer.getByTestId('listing-card').first().click();
  const title = await buyer.getByTestId('listing-title').textContent();
  expect(title).toMatch(/Matched pair of 780 nm/);
  await hydrated(buyer, '#qty');
  await buyer.getByLabel('Quantity').fill('2');
  await buyer.getByRole('button', { name: 'Add to cart' }).click();
  await buyer.getByRole('link', { name: 'Go to the cart' }).click();
  await hydrated(buyer, '#ship-to');
  await expect(buyer.getByTestId('cart-item')).toHaveCount(1);
  await buyer.getByRole('button', { name: 'Check out and pay' }).click();

  await buyer.getByLabel('Name on the card').fill('Mireille Aubertin');
  await buyer.getByLabel('Card number').fill('4242 4242 4242 4242');
  await buyer.getByLabel('Expiry (MM / YY)').fill('12 / 34');
  await buyer.getByLabel('Security code').fill('123');
  await buyer.getByRole('button', { name: /^Pay / }).click();
  await expect(buyer.getByRole('heading', { name: 'Paid — thank you' })).toBeVisible();
  await expect(buyer.getByTestId('order-status')).toHaveText('paid');
  const orderLink = buyer.getByRole('link', { name: /^Order / });
  const orderPath = await orderLink.getAttribute('href');

  await seller.goto(orderPath!);
  await hydrated(seller, '#carrier');
  await seller.getByLabel('Carrier').fill('Lab courier');
  await seller.getByLabel('Tracking number').fill('LY-2026-0042');
  await seller.getByRole('button', { name: 'Mark shipped' }).click();
  await expect(seller.getByTestId('order-status')).toHaveText('shipped');

  await buyer.goto(orderPath!);
  await hydrated(buyer, 'button');
  await buyer.getByRole('button', { name: 'I received the part and it is as described' }).click();
  await expect(buyer.getByTestId('order-status')).toHaveText('completed');

  await seller.goto('/payouts');
  const transfer = seller.getByTestId('transfer-amount').first();
  await expect(transfer).toBeVisible();
  const price = await buyer.evaluate(
    () => document.querySelector('[data-testid=receipt] tbody tr:last-child td:last-child')?.textContent ?? '',
  );
  const priceValue = Number(price.replace(/[^0-9.]/g, ''));
  expect(Number((await transfer.textContent())!.replace(/[^0-9.]/g, ''))).toBeCloseTo(priceValue * 0.92, 2);
  await expect(async () => {
    await seller.reload();
    await expect(seller.getByTestId('payout-status').first()).toHaveText('paid');
  }).toPass({ timeout: 20_000 });
  await sellerCtx.close();
  await buyerCtx.close();
});
