import type { EventLog } from './events';
import type { Scheduler } from './scheduler';
import type { StateStore, StripeObject } from './state';

/** Timings and defaults a test or developer may change through `startStripeFake` options. */
export interface StripeFakeSettings {
  /** Origin of the hosted pages (`http://127.0.0.1:12111`); set once the server listens. */
  publicUrl: string;
  /** The platform's country and default currency: new accounts and empty balances use them. */
  platformCountry: string;
  platformCurrency: string;
  /** How long a succeeded charge's money stays pending before it counts as available. */
  balanceAvailableAfterMs: number;
  /** How long a payout stays pending before it is paid (or fails). */
  payoutDelayMs: number;
  /** Decides, when a payout falls due, whether it fails instead of being paid. */
  failPayout: (payout: StripeObject, account: string) => boolean;
}

/** What every route handler and page works with. */
export interface StripeFakeContext {
  state: StateStore;
  events: EventLog;
  scheduler: Scheduler;
  settings: StripeFakeSettings;
}
