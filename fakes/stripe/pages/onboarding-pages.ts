import type { ServerResponse } from 'node:http';
import { completeOnboarding, onboardingPagePath, type ConnectedAccount } from '../connect';
import type { StripeFakeContext } from '../context';
import { unixSeconds } from '../ids';
import type { AccountLinkRecord } from '../state';
import { html, redirect, sendPage } from './layout';

function linkAccount(context: StripeFakeContext, link: AccountLinkRecord): ConnectedAccount | undefined {
  return context.state.get<ConnectedAccount>('account', link.account);
}

/** An expired or used link sends the user to refresh_url, where the app makes a fresh one. */
function isStale(link: AccountLinkRecord): boolean {
  return link.used || unixSeconds() >= link.expiresAt;
}

export function showOnboardingPage(response: ServerResponse, context: StripeFakeContext, token: string, link: AccountLinkRecord): void {
  const account = linkAccount(context, link);
  if (!account || isStale(link)) {
    redirect(response, link.refreshUrl);
    return;
  }
  sendPage(
    response,
    200,
    'Set up payouts',
    html`<h1>Set up your payout account</h1>
      <p>Account <code>${account.id}</code>${account.email ? html` for ${account.email}` : html``}, ${account.country}.</p>
      <p class="note">
        This page stands in for the provider's onboarding: completing it marks the account's details as submitted and turns on charges and
        payouts, with a test bank account ending in 6789.
      </p>
      <form method="post" action="${onboardingPagePath(token)}">
        <button type="submit">Complete onboarding</button>
      </form>
      <p class="note"><a href="${link.returnUrl}">Leave without finishing</a></p>`,
  );
}

export function submitOnboardingPage(response: ServerResponse, context: StripeFakeContext, link: AccountLinkRecord): void {
  const account = linkAccount(context, link);
  if (!account || isStale(link)) {
    redirect(response, link.refreshUrl);
    return;
  }
  completeOnboarding(context, account);
  link.used = true;
  redirect(response, link.returnUrl);
}
