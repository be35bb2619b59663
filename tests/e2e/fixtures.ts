import { test as base, expect } from '@playwright/test';

/** Every e2e test fails on an unexpected console error or an uncaught page error. */
export const test = base.extend<{ consoleErrors: string[] }>({
  consoleErrors: [
    async ({ page }, use) => {
      const errors: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error' && !expectedConsoleError(m.text())) errors.push(m.text());
      });
      page.on('pageerror', (e) => errors.push(String(e)));
      await use(errors);
      expect(errors, 'console errors').toEqual([]);
    },
    { auto: true },
  ],
});

/** The browser logs failed fetches (4xx) that the page handles on purpose: a 403 page load, a refused upload shown beside its file. */
function expectedConsoleError(text: string): boolean {
  return /Failed to load resource: the server responded with a status of (400|401|403|404|409|413|415|422|429)/.test(text);
}

export { expect };
