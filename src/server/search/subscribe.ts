/**
 * Hands every in-process listing change to the search index (and through it to the saved-search
 * matcher). listings/service.ts imports this module for its side effect, so the listener exists in
 * every process that changes listings, whether or not it has searched yet. The index is loaded
 * lazily: it imports the listings service itself.
 */
import { onListingChanged } from '../listings/events';

onListingChanged((id) => {
  void import('./service').then((m) => m.liveIndex().listingChanged(id));
});
