import { test as base, expect, type Page } from '@playwright/test';

/**
 * Every e2e test fails on an unexpected console error or an uncaught page error, in its `page` and in every
 * page of the contexts it opens itself (a second user): a CSP violation is a console error, so each test also
 * checks the pages it visits against the Content-Security-Policy.
 */
export const test = base.extend<{ consoleErrors: string[] }>({
  consoleErrors: [
    async ({ page, browser }, use) => {
      const errors: string[] = [];
      const watch = (p: Page) => {
        p.on('console', (m) => {
          if (m.type() === 'error' && !expectedConsoleError(m.text())) errors.push(`${p.url()}: ${m.text()}`);
        });
        p.on('pageerror', (e) => errors.push(`${p.url()}: ${String(e)}`));
      };
      watch(page);
      const newContext = browser.newContext;
      browser.newContext = async (...args) => {
        const ctx = await newContext.apply(browser, args);
        ctx.on('page', watch);
        return ctx;
      };
      try {
        await use(errors);
      } finally {
        browser.newContext = newContext;
      }
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
