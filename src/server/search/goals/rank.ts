/**
 * Ranking of goal results (issue 5): passes first, then worst-case headroom, then price. Within
 * "does not fit", listings with a headroom (they reach a figure, just too low) come before those
 * that cannot be evaluated at the goal at all (out of band, unstable, bandwidth too low).
 */
import { FitInputError, type GoalResult, type Verdict } from '../../../lib/fit';

export interface RankKey {
  /** 2 fits, 1 marginal, 0 does not fit. */
  rank: number;
  headroom: number | null;
}

export const VERDICT_RANK: Record<Verdict, number> = { fits: 2, marginal: 1, 'does-not-fit': 0 };

/** What a listing gets when it has no values at the goal's wavelength or its specs cannot be read. */
export const BLOCKED: RankKey = { rank: 0, headroom: null };

export function keyOf(r: Pick<GoalResult, 'verdict' | 'headroom'>): RankKey {
  return { rank: VERDICT_RANK[r.verdict], headroom: r.headroom };
}

/** Negative when a ranks before b. */
export function compareKeys(a: RankKey, b: RankKey): number {
  if (a.rank !== b.rank) return b.rank - a.rank;
  if (a.headroom === null || b.headroom === null) return a.headroom === b.headroom ? 0 : a.headroom === null ? 1 : -1;
  return b.headroom - a.headroom;
}

/** A does-not-fit result for a listing whose specs the engine refuses (the reason says which field). */
export function unreadable(e: FitInputError, unit: string, goal: number | null, formula: string, source: string): GoalResult {
  return {
    pass: false,
    verdict: 'does-not-fit',
    figure: null,
    worst: null,
    goal,
    headroom: null,
    unit,
    reasons: [`the listing's specs cannot be evaluated: ${e.message}`],
    notes: [],
    formula,
    source,
  };
}
