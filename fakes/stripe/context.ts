import type { EventLog } from './events';
import type { StateStore } from './state';

/** What every route handler works with. */
export interface StripeFakeContext {
  state: StateStore;
  events: EventLog;
}
