import { test, expect } from './fixtures';
import { linkIn, waitForMail } from '../setup/mailbox';
import { E2E_MAIL_DIR } from './paths';

test('sign up, confirm by the e-mailed link, sign in; a buyer meets the 403 page at /admin; an admin grants the seller role', async ({
  page,
  browser,
}) => {
  const email = `e2e.${Date.now()}@lab.example`;
  await page.goto('/sign-up');
  await page.getByRole('button', { name: 'Create account' }).click();
  await expect(page.getByText('Enter your name.')).toBeVisible();

  await page.getByLabel('Your name').fill('Elena Testa');
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill('e2e-password-1');
  await page.getByRole('button', { name: 'Create account' }).click();
  await expect(page.getByText('Check your inbox.')).toBeVisible();

  const mail = await waitForMail(E2E_MAIL_DIR, email, /Confirm your e-mail/);
  await page.goto(linkIn(mail, '/verify'));
  await page.getByRole('button', { name: 'Confirm my e-mail address' }).click();
  await expect(page.getByText('Your e-mail address is confirmed.')).toBeVisible();
  await page.getByRole('link', { name: 'Sign in to continue' }).click();

  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill('e2e-password-1');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/account$/);
  await expect(page.getByTestId('roles')).toHaveText('Buyer');

  const denied = await page.goto('/admin');
  expect(denied?.status()).toBe(403);
  await expect(page.getByRole('heading', { name: 'No access' })).toBeVisible();

  const adminCtx = await browser.newContext();
  const admin = await adminCtx.newPage();
  await admin.goto('/sign-in?next=/admin');
  await admin.getByLabel('E-mail address').fill('admin@demo.lightyard.example');
  await admin.getByLabel('Password').fill('demo-password-1');
  await admin.getByRole('button', { name: 'Sign in' }).click();
  await admin.waitForURL((u) => u.pathname === '/admin');
  await admin.getByLabel('Find people').fill(email);
  const seller = admin.getByRole('checkbox', { name: `Seller role for ${email}` });
  await expect(seller).not.toBeChecked();
  await seller.check();
  await expect(seller).toBeChecked();
  await adminCtx.close();

  await page.goto('/account');
  await expect(page.getByTestId('roles')).toHaveText('Buyer, Seller');
});

test('the sign-in form says the same for an unknown address and a wrong password', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail address').fill('nobody@nowhere.example');
  await page.getByLabel('Password').fill('whatever');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toHaveText('The e-mail address or password is not right.');
});
