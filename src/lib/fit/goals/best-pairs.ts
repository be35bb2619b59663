// Best two-listing mirror pairs for a cavity goal without evaluating all N² pairs. The worst-case
// finesse (form 1.3) falls with each mirror's worst-case T + loss, so with the mirrors sorted by
// that loss budget, pair (i, j) is never better than (i, j − 1) or than (i − 1, i) for j = i + 1:
// a best-first walk over that tree (a max-heap) yields pairs in order, and only stability (which
// depends on both radii) can reject a popped pair.

import { FitInputError } from '../errors';
import { finesseFromMirrorLosses } from '../cavity';
import { gaussianMode } from '../modes';
import { integerAtLeast, requireArray } from '../validate';
import { evaluateCavityGoal, mirrorAtWavelength, modeRadius, parseCavityGoal } from './cavity';
import type { CavityGoal, CavityGoalResult, MirrorSpec } from './types';

export interface MirrorPair {
  /** Indices into the mirrors array; a has the lower worst-case loss. */
  a: number;
  b: number;
  result: CavityGoalResult;
}

interface Candidate {
  index: number;
  lossWorstPpm: number;
  rocM: number | null;
}

interface Node {
  i: number;
  j: number;
  score: number;
}

/** Higher score first; equal scores in index order so the walk is deterministic. */
function before(x: Node, y: Node): boolean {
  if (x.score !== y.score) return x.score > y.score;
  return x.i !== y.i ? x.i < y.i : x.j < y.j;
}

class MaxHeap {
  private readonly items: Node[] = [];

  get size(): number {
    return this.items.length;
  }

  push(n: Node): void {
    const a = this.items;
    a.push(n);
    let k = a.length - 1;
    while (k > 0) {
      const p = (k - 1) >> 1;
      if (!before(a[k] as Node, a[p] as Node)) break;
      [a[k], a[p]] = [a[p] as Node, a[k] as Node];
      k = p;
    }
  }

  pop(): Node | undefined {
    const a = this.items;
    const top = a[0];
    const last = a.pop();
    if (a.length > 0 && last !== undefined) {
      a[0] = last;
      let k = 0;
      for (;;) {
        const l = 2 * k + 1;
        const r = l + 1;
        let m = k;
        if (l < a.length && before(a[l] as Node, a[m] as Node)) m = l;
        if (r < a.length && before(a[r] as Node, a[m] as Node)) m = r;
        if (m === k) break;
        [a[k], a[m]] = [a[m] as Node, a[k] as Node];
        k = m;
      }
    }
    return top;
  }
}

/**
 * The k pairs of different listings with the highest worst-case finesse that form a stable
 * resonator at the buyer's length, best first. Mirrors out of band or specified at oblique incidence
 * are left out. Each returned pair carries its full evaluateCavityGoal result.
 */
export function bestPairs(goal: CavityGoal, mirrors: readonly MirrorSpec[], k: number): MirrorPair[] {
  const list = requireArray('mirrors', mirrors) as MirrorSpec[];
  const want = integerAtLeast('k', k, 1);
  const pairGoal: CavityGoal = { ...goal, configuration: 'two-listings' };
  const { lambdaNm, lengthM, extraLoss } = parseCavityGoal(pairGoal);
  const candidates: Candidate[] = [];
  list.forEach((m, index) => {
    const r = mirrorAtWavelength(m, lambdaNm, `mirrors[${index}]`);
    if (r.mirror !== null) candidates.push({ index, lossWorstPpm: r.mirror.totalWorstPpm, rocM: r.mirror.rocM });
  });
  candidates.sort((x, y) => x.lossWorstPpm - y.lossWorstPpm || x.index - y.index);
  const n = candidates.length;
  const score = (i: number, j: number): number => {
    const l1 = (candidates[i] as Candidate).lossWorstPpm * 1e-6;
    const l2 = (candidates[j] as Candidate).lossWorstPpm * 1e-6;
    if (l1 === 0 && l2 === 0 && extraLoss === 0) {
      throw new FitInputError(
        `mirrors[${(candidates[i] as Candidate).index}].lossPpm`,
        'worst-case T + loss of 0 ppm on both mirrors: the finesse is unbounded',
      );
    }
    return finesseFromMirrorLosses({ loss1: l1, loss2: l2, extraLoss });
  };
  const out: MirrorPair[] = [];
  if (n < 2) return out;
  const heap = new MaxHeap();
  heap.push({ i: 0, j: 1, score: score(0, 1) });
  const wavelengthM = lambdaNm * 1e-9;
  while (out.length < want && heap.size > 0) {
    const node = heap.pop() as Node;
    const { i, j } = node;
    if (j + 1 < n) heap.push({ i, j: j + 1, score: score(i, j + 1) });
    if (j === i + 1 && i + 2 < n) heap.push({ i: i + 1, j: i + 2, score: score(i + 1, i + 2) });
    const ci = candidates[i] as Candidate;
    const cj = candidates[j] as Candidate;
    if (!gaussianMode({ lengthM, roc1M: modeRadius(ci.rocM), roc2M: modeRadius(cj.rocM), wavelengthM }).stable) continue;
    out.push({
      a: ci.index,
      b: cj.index,
      result: evaluateCavityGoal(pairGoal, list[ci.index] as MirrorSpec, list[cj.index] as MirrorSpec),
    });
  }
  return out;
}
