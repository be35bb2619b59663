// Worst case over toleranced inputs by interval arithmetic at the pessimistic ends (physics.md A12
// form 12.5: every formula of the engine is monotonic in each input, so the extremes over the
// tolerance box lie at its corners).

import { FitInputError } from './errors';
import { finite, nonNegative } from './validate';

/** A value with a symmetric ± tolerance in the same unit, optionally clamped to its physical domain. */
export interface Toleranced {
  value: number;
  tol?: number;
  min?: number;
  max?: number;
}

export type Better = 'higher' | 'lower';

export interface WorstCase {
  nominal: number;
  /** The pessimistic end: lowest when higher is better, highest when lower is better. */
  worst: number;
  best: number;
}

/** Corners grow as 2ⁿ; beyond this the caller should fold inputs together. */
const MAX_TOLERANCED = 12;

function isToleranced(v: unknown): v is Toleranced {
  return typeof v === 'object' && v !== null && 'value' in v;
}

function ends(field: string, t: Toleranced): [number, number] {
  const value = finite(`${field}.value`, t.value);
  const tol = t.tol === undefined ? 0 : nonNegative(`${field}.tol`, t.tol);
  const lo = t.min === undefined ? -Infinity : finite(`${field}.min`, t.min);
  const hi = t.max === undefined ? Infinity : finite(`${field}.max`, t.max);
  if (lo > hi) throw new FitInputError(field, `min ${lo} exceeds max ${hi}`);
  return [Math.min(hi, Math.max(lo, value - tol)), Math.min(hi, Math.max(lo, value + tol))];
}

/**
 * Evaluates fn at the nominal inputs and at every corner of the tolerance box, and reports the
 * nominal, the pessimistic (worst) and the optimistic (best) value. Plain numbers are exact inputs.
 */
export function worstCase<K extends string>(
  fn: (inputs: Record<K, number>) => number,
  inputs: Record<K, number | Toleranced>,
  options: { better?: Better } = {},
): WorstCase {
  const better = options.better ?? 'higher';
  const keys = Object.keys(inputs) as K[];
  const nominalInputs = {} as Record<K, number>;
  const varying: { key: K; lo: number; hi: number }[] = [];
  for (const key of keys) {
    const v = inputs[key];
    if (isToleranced(v)) {
      const [lo, hi] = ends(key, v);
      nominalInputs[key] = Math.min(hi, Math.max(lo, v.value));
      if (lo !== hi) varying.push({ key, lo, hi });
    } else {
      nominalInputs[key] = finite(key, v);
    }
  }
  if (varying.length > MAX_TOLERANCED) {
    throw new FitInputError('inputs', `at most ${MAX_TOLERANCED} toleranced inputs, got ${varying.length}`);
  }
  const check = (x: number): number => {
    if (!Number.isFinite(x)) throw new FitInputError('fn', 'the formula returned a non-finite value inside the tolerance box');
    return x;
  };
  const nominal = check(fn({ ...nominalInputs }));
  if (varying.length === 0) return { nominal, worst: nominal, best: nominal };
  let lowest = nominal;
  let highest = nominal;
  const corner = { ...nominalInputs };
  for (let mask = 0; mask < 1 << varying.length; mask++) {
    for (let i = 0; i < varying.length; i++) {
      const v = varying[i] as { key: K; lo: number; hi: number };
      corner[v.key] = mask & (1 << i) ? v.hi : v.lo;
    }
    const x = check(fn({ ...corner }));
    if (x < lowest) lowest = x;
    if (x > highest) highest = x;
  }
  return better === 'higher' ? { nominal, worst: lowest, best: highest } : { nominal, worst: highest, best: lowest };
}
