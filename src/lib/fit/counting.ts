// Single-photon counting: Bell-test efficiency thresholds, CH–Eberhard J, Klyshko heralding
// efficiency, accidental coincidences, CAR, dead time, timing jitter (physics.md A6, forms 6.1–6.9).
// Sources: A. Garg and N. D. Mermin, "Detector inefficiencies in the Einstein-Podolsky-Rosen
// experiment", Phys. Rev. D 35, 3831 (1987); P. H. Eberhard, "Background level and counter
// efficiencies required for a loophole-free Einstein-Podolsky-Rosen experiment", Phys. Rev. A 47,
// R747 (1993); D. N. Klyshko, Sov. J. Quantum Electron. 10, 1112 (1980); G. F. Knoll, "Radiation
// Detection and Measurement", 4th ed. (2010), ch. 4 (dead-time models); M. Giustina et al.,
// "Significant-loophole-free test of Bell's theorem with entangled photons", PRL 115, 250401 (2015).

import { FitInputError } from './errors';
import { finite, finiteResult, nonNegative, oneOf, positive, requireArray } from './validate';

export type DeadTimeModel = 'non-paralyzable' | 'paralyzable';

const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/** Forms 6.1 and 6.2: symmetric detection efficiency a loophole-free test must exceed (zero background). */
export function bellThresholds(): { chsh: number; eberhard: number } {
  return { chsh: 2 / (1 + Math.SQRT2), eberhard: 2 / 3 };
}

/** Form 6.7 (R/(1 + R·τ_d)) or 6.8 (R·exp(−R·τ_d)): the rate a detector with dead time registers. */
export function deadTimeRate(input: { trueRate: number; deadTimeS: number; model: DeadTimeModel }): number {
  const r = nonNegative('trueRate', input.trueRate);
  const tau = nonNegative('deadTimeS', input.deadTimeS);
  const model = oneOf('model', input.model, ['non-paralyzable', 'paralyzable'] as const);
  const x = finiteResult('trueRate', r * tau, 'R·τ_d');
  return model === 'non-paralyzable' ? r / (1 + x) : r * Math.exp(-x);
}

/** Form 6.7 inverted (non-paralyzable): R = R_meas/(1 − R_meas·τ_d); no true rate reaches 1/τ_d. */
export function trueRateFromMeasured(input: { measuredRate: number; deadTimeS: number }): number {
  const m = nonNegative('measuredRate', input.measuredRate);
  const tau = nonNegative('deadTimeS', input.deadTimeS);
  const x = m * tau;
  if (!(x < 1)) {
    throw new FitInputError('measuredRate', `is at or above the saturation rate 1/τ_d = ${1 / tau} /s of a non-paralyzable detector`);
  }
  return finiteResult('measuredRate', m / (1 - x), 'true rate');
}

/**
 * Highest registered rate: 1/(e·τ_d) at R = 1/τ_d for the paralyzable model (6.8); the
 * non-paralyzable model approaches 1/τ_d without reaching it (atTrueRate null).
 */
export function maxMeasuredRate(input: { deadTimeS: number; model: DeadTimeModel }): {
  maxRate: number;
  atTrueRate: number | null;
} {
  const tau = positive('deadTimeS', input.deadTimeS);
  const model = oneOf('model', input.model, ['non-paralyzable', 'paralyzable'] as const);
  const inv = finiteResult('deadTimeS', 1 / tau, 'saturation rate');
  return model === 'paralyzable' ? { maxRate: inv / Math.E, atTrueRate: inv } : { maxRate: inv, atTrueRate: null };
}

/** Form 6.5: A = N1·N2·τ_c with τ_c the full width of the coincidence window. */
export function accidentalRate(input: { rate1: number; rate2: number; windowS: number }): number {
  const n1 = nonNegative('rate1', input.rate1);
  const n2 = nonNegative('rate2', input.rate2);
  const w = nonNegative('windowS', input.windowS);
  return finiteResult('rate1', n1 * n2 * w, 'accidental rate');
}

/** Form 6.6 in the (C − A)/A convention (C/A is this plus 1). */
export function coincidenceToAccidental(input: { coincidences: number; accidentals: number }): number {
  const c = nonNegative('coincidences', input.coincidences);
  const a = positive('accidentals', input.accidentals);
  return finiteResult('accidentals', (c - a) / a, 'coincidence-to-accidental ratio');
}

/**
 * Form 6.4, Klyshko: η = (C − A)/(N_h − D_h), the efficiency of the arm opposite the herald
 * (heralding on the idler gives the signal arm's efficiency).
 */
export function heraldingEfficiency(input: {
  coincidences: number;
  accidentals?: number;
  singlesHerald: number;
  darkHerald?: number;
}): number {
  const c = nonNegative('coincidences', input.coincidences);
  const a = input.accidentals === undefined ? 0 : nonNegative('accidentals', input.accidentals);
  const n = nonNegative('singlesHerald', input.singlesHerald);
  const d = input.darkHerald === undefined ? 0 : nonNegative('darkHerald', input.darkHerald);
  if (!(n > d)) throw new FitInputError('singlesHerald', 'must exceed the herald dark counts');
  return finiteResult('singlesHerald', (c - a) / (n - d), 'heralding efficiency');
}

/** Form 6.9: FWHM of independent Gaussian jitter contributions add in quadrature. */
export function combinedJitter(fwhmS: readonly number[]): number {
  const parts = requireArray('fwhmS', fwhmS);
  if (parts.length === 0) throw new FitInputError('fwhmS', 'needs at least one jitter contribution');
  const scale = Math.max(...parts.map((p, i) => nonNegative(`fwhmS[${i}]`, p)));
  if (scale === 0) return 0;
  let sum = 0;
  for (const p of parts as number[]) sum += (p / scale) * (p / scale);
  return finiteResult('fwhmS', scale * Math.sqrt(sum), 'combined jitter');
}

/**
 * erf by its everywhere-positive series erf(x) = (2/√π)·e^(−x²)·Σ 2ⁿx^(2n+1)/(1·3·…·(2n+1)); no
 * cancellation, so it is accurate to double precision; beyond |x| = 6, 1 − erf < 2e-17.
 */
export function erf(x: number): number {
  const ax = Math.abs(finite('x', x));
  if (ax >= 6) return Math.sign(x);
  let term = ax;
  let sum = ax;
  const x2 = ax * ax;
  for (let n = 1; n < 500 && term > sum * 1e-17; n++) {
    term *= (2 * x2) / (2 * n + 1);
    sum += term;
  }
  return Math.sign(x) * (2 / Math.sqrt(Math.PI)) * Math.exp(-x2) * sum;
}

/** Form 6.9: share of true coincidences inside a centred window W, erf(W/(2√2·σ)), σ = FWHM/2.35482. */
export function windowCapture(input: { windowS: number; jitterFwhmS: number }): number {
  const w = nonNegative('windowS', input.windowS);
  const j = nonNegative('jitterFwhmS', input.jitterFwhmS);
  const sigma = j / FWHM_PER_SIGMA;
  if (sigma === 0) return w > 0 ? 1 : 0;
  return erf(w / sigma / (2 * Math.SQRT2));
}

export interface ChEberhardInput {
  /** Trials per setting pair. */
  trials: { a1b1: number; a1b2: number; a2b1: number; a2b2: number };
  /** Both detectors click at a1b1. */
  coincidencesA1B1: number;
  /** Alice clicks, Bob does not, at a1b2. */
  aliceOnlyA1B2: number;
  /** Bob clicks, Alice does not, at a2b1. */
  bobOnlyA2B1: number;
  coincidencesA2B2: number;
}

/**
 * Form 6.3: J = p(++|a1b1) − p(+0|a1b2) − p(0+|a2b1) − p(++|a2b2); local realism needs J ≤ 0.
 */
export function chEberhardJ(input: ChEberhardInput): { j: number; violation: boolean; rawCountSum: number } {
  const t = input.trials;
  const n11 = positive('trials.a1b1', t.a1b1);
  const n12 = positive('trials.a1b2', t.a1b2);
  const n21 = positive('trials.a2b1', t.a2b1);
  const n22 = positive('trials.a2b2', t.a2b2);
  const c11 = nonNegative('coincidencesA1B1', input.coincidencesA1B1);
  const c12 = nonNegative('aliceOnlyA1B2', input.aliceOnlyA1B2);
  const c21 = nonNegative('bobOnlyA2B1', input.bobOnlyA2B1);
  const c22 = nonNegative('coincidencesA2B2', input.coincidencesA2B2);
  const j = finiteResult('trials', c11 / n11 - c12 / n12 - c21 / n21 - c22 / n22, 'J');
  return { j, violation: j > 0, rawCountSum: finiteResult('coincidencesA1B1', c11 - c12 - c21 - c22, 'count sum') };
}
