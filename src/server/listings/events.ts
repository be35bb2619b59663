type Listener = (listingId: string) => void;
const listeners = new Set<Listener>();

/** In-process notice that a listing changed (the search index listens); other instances poll the database. */
export function onListingChanged(fn: Listener): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}

export function notifyListingChanged(listingId: string): void {
  for (const fn of listeners) fn(listingId);
}
