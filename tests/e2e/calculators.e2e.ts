import type { Locator } from '@playwright/test';
import { test, expect } from './fixtures';

/** Islands hydrate when they come into view; typing before that would be undone by hydration. */
async function hydrated(section: Locator) {
  await section.scrollIntoViewIfNeeded();
  await expect(section.locator('xpath=ancestor::astro-island[1]')).not.toHaveAttribute('ssr');
}

// Check value: physics.md A1.3, R1 = R2 = 0.99 gives ℱ = 312.585 by the standard form 1.3 —
// derived there from Hecht, Optics, 5th ed. (2017) §9.6.
test('the cavity calculator shows the finesse and a plot, and warns about an unstable geometry', async ({ page }) => {
  await page.goto('/tools');
  const cavity = page.locator('section', { has: page.getByRole('heading', { name: 'Cavity: finesse, linewidth, mode' }) });
  await hydrated(cavity);
  await cavity.getByLabel('Transmission', { exact: true }).first().fill('0.5');
  await cavity.getByLabel('Transmission unit').first().selectOption('pct');
  await cavity.getByLabel('Loss (absorption + scatter)', { exact: true }).first().fill('0.5');
  await cavity.getByLabel('Loss (absorption + scatter) unit').first().selectOption('pct');
  await cavity.getByLabel('Transmission', { exact: true }).nth(1).fill('1');
  await cavity.getByLabel('Transmission unit').nth(1).selectOption('pct');
  await cavity.getByLabel('Loss (absorption + scatter)', { exact: true }).nth(1).fill('0');
  await expect(cavity.getByTestId('cavity-finesse')).toHaveText('313');
  await expect(cavity.getByTestId('plot').locator('canvas')).toHaveCount(1);
  await expect(cavity.getByTestId('cavity-stability')).toHaveCount(0);

  // symmetric, L = 0.25 m, R = 0.10 m: g1·g2 = 2.25, unstable (physics.md A2.4, Kogelnik & Li 1966)
  await cavity.getByLabel('Cavity length', { exact: true }).fill('25');
  await cavity.getByLabel('Radius of curvature', { exact: true }).first().fill('0.1');
  await cavity.getByLabel('Radius of curvature', { exact: true }).nth(1).fill('0.1');
  await expect(cavity.getByTestId('cavity-stability')).toContainText('Unstable: g1·g2 = 2.250');
  await expect(cavity.getByTestId('cavity-waist')).toHaveCount(0);
});

test('the squeezing and counting calculators compute as you type', async ({ page }) => {
  await page.goto('/tools');
  const sq = page.locator('section', { has: page.getByRole('heading', { name: /Squeezing/ }) });
  await hydrated(sq);
  await sq.getByRole('radio', { name: 'Initial squeezing' }).check();
  // physics.md A5.4: 10 dB pure state at η = 0.90 measures 7.2125 dB (beam-splitter model 5.1)
  await sq.getByRole('textbox', { name: 'Initial squeezing' }).fill('10');
  for (const l of ['Escape efficiency', 'Propagation efficiency', 'Fringe visibility']) await sq.getByLabel(l).fill('100');
  await sq.getByLabel('Detector quantum efficiency').fill('90');
  await sq.getByLabel('Dark-noise clearance').fill('200');
  await sq.getByLabel('Phase noise (fixed offset)', { exact: true }).fill('0');
  await expect(sq.getByTestId('sq-measured')).toHaveText('7.21\u2009dB');
  await expect(sq.getByTestId('plot')).toHaveCount(1);

  const ct = page.locator('section', { has: page.getByRole('heading', { name: /Photon counting/ }) });
  await hydrated(ct);
  await ct.getByLabel('Dead time', { exact: true }).fill('0');
  await ct.getByLabel('Dark count rate', { exact: true }).fill('0');
  await ct.getByLabel('Timing jitter per detector (FWHM)', { exact: true }).fill('0');
  await ct.getByLabel('Detector efficiency at your wavelength').fill('80');
  await ct.getByLabel('Your optical efficiency per arm (coupling, filters)').fill('100');
  await expect(ct.getByTestId('ct-heralding')).toHaveText('80\u2009%');
  await expect(ct.getByText('✗ below the CHSH threshold 82.8 %')).toBeVisible();
});
