/** The process's live search index, and the searches the endpoints and pages run on it. */
import type { GoalSearchRequest, TextSearchQuery } from '../../lib/schemas/search';
import type { GoalSearchResponse, TextSearchResponse } from '../../lib/search/results';
import { LiveIndex } from './live-index';
import { matchApprovedListings } from './matcher';
import { goalSearch, textSearch } from './search';

let live: LiveIndex | undefined;

export function liveIndex(): LiveIndex {
  live ??= new LiveIndex(matchApprovedListings);
  return live;
}

export async function runTextSearch(q: TextSearchQuery): Promise<TextSearchResponse> {
  return textSearch(await liveIndex().fresh(), q);
}

/** Throws FitInputError when the fit engine refuses the goal itself. */
export async function runGoalSearch(req: GoalSearchRequest): Promise<GoalSearchResponse> {
  return goalSearch(await liveIndex().fresh(), req);
}
