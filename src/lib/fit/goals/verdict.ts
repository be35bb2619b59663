// How a computed figure meets a goal (product goal semantics): fits when the worst case meets it,
// marginal when only the nominal does, does-not-fit otherwise; headroom measured on the worst case.

import { finiteResult } from '../validate';
import type { Constraint, Verdict } from './types';

export type Better = 'higher' | 'lower' | 'higher-db';

const RANK: Record<Verdict, number> = { 'does-not-fit': 0, marginal: 1, fits: 2 };

function meets(x: number, goal: number, better: Better): boolean {
  return better === 'lower' ? x <= goal : x >= goal;
}

export function verdictOf(nominal: number, worst: number, goal: number, better: Better): Verdict {
  if (meets(worst, goal, better)) return 'fits';
  return meets(nominal, goal, better) ? 'marginal' : 'does-not-fit';
}

/** worst/goal − 1 (higher is better), goal/worst − 1 (lower is better), worst − goal (dB). */
export function headroomOf(worst: number, goal: number, better: Better): number {
  if (better === 'higher-db') return worst - goal;
  return finiteResult('goal', better === 'higher' ? worst / goal - 1 : goal / worst - 1, 'headroom');
}

export function worse(a: Verdict, b: Verdict): Verdict {
  return RANK[a] <= RANK[b] ? a : b;
}

export function constraint(
  name: string,
  figure: number,
  worst: number,
  goal: number,
  unit: string,
  better: 'higher' | 'lower',
  formula: string,
): Constraint {
  return {
    name,
    figure,
    worst,
    goal,
    unit,
    better,
    headroom: headroomOf(worst, goal, better),
    verdict: verdictOf(figure, worst, goal, better),
    formula,
  };
}

/** The constraint with the least worst-case headroom: the quantity that limits the fit. */
export function limiting(constraints: readonly Constraint[]): Constraint | null {
  let best: Constraint | null = null;
  for (const c of constraints) {
    if (best === null || RANK[c.verdict] < RANK[best.verdict] || (c.verdict === best.verdict && c.headroom < best.headroom)) {
      best = c;
    }
  }
  return best;
}
