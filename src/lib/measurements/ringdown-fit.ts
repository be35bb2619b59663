// Cavity ring-down: least-squares fit of I(t) = A·exp(−(t − t0)/τ) + B with Levenberg–Marquardt,
// started from a weighted log-linear fit, and the standard uncertainty of τ from the covariance
// matrix s²·(JᵀJ)⁻¹ at the solution (s² = residual sum of squares / (n − 3)).
// Sources: K. Levenberg, Q. Appl. Math. 2, 164 (1944); D. W. Marquardt, J. SIAM 11, 431 (1963);
// covariance of nonlinear least squares: W. H. Press et al., "Numerical Recipes", 3rd ed. (2007),
// §15.5; expanded uncertainty with k = 2: JCGM 100:2008 (GUM) §6. Loss and finesse from τ:
// physics.md A1 form 1.10.

import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { lossFromRingdown } from '../fit';
import type { RingdownFigures, RingdownFit, TracePoint } from './types';

export const MIN_RINGDOWN_POINTS = 10;
const CURVE_SAMPLES = 200;
/** The decay is taken to start at the last sample above this share of the initial level (skips a pre-trigger plateau). */
const START_LEVEL = 0.9;
/** Share of the trace at its end that sets the offset guess. */
const TAIL_SHARE = 0.1;
/** The log-linear start uses the decay while it stays above this share of the amplitude, well clear of the offset. */
const LOG_FIT_LEVEL = 0.1;
/**
 * Longer traces reach the optimiser averaged in bins of consecutive samples (each optimiser step costs
 * a pass over the data). Averaging A·exp(−t/τ) + B over equal bins scales A by sinh(h)/h (h = half
 * the bin width over τ, here ≪ 1) and leaves τ and B as they are; the covariance still uses every sample.
 */
const MAX_OPTIMISER_POINTS = 2000;
/** Bounds of τ over its first estimate: a fit that runs into them has not found the decay. */
const TAU_RATIO_MIN = 1e-3;
const TAU_RATIO_MAX = 1e3;

export class RingdownFitError extends Error {}

function mean(xs: readonly number[]): number {
  return xs.reduce((s, x) => s + x, 0) / xs.length;
}

/** Index where the decay starts: the last sample at or above 90 % of the way from the tail to the top level. */
function decayStart(y: readonly number[], offset: number): number {
  const sorted = [...y].sort((a, b) => b - a);
  const top = mean(sorted.slice(0, Math.max(1, Math.floor(y.length / 100))));
  const threshold = offset + START_LEVEL * (top - offset);
  let start = 0;
  for (let i = 0; i < y.length; i++) if ((y[i] as number) >= threshold) start = i;
  return start;
}

/** Weighted fit of ln(y − B) = ln A − u/τ over the leading part of the decay; weights (y − B)² undo the log's noise scaling. */
function logLinear(u: readonly number[], y: readonly number[], offset: number, amplitude: number): { tau: number; amplitude: number } {
  let sw = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  let used = 0;
  for (let i = 0; i < u.length; i++) {
    const d = (y[i] as number) - offset;
    if (d < LOG_FIT_LEVEL * amplitude) break;
    const w = d * d;
    const x = u[i] as number;
    const z = Math.log(d);
    sw += w;
    sx += w * x;
    sy += w * z;
    sxx += w * x * x;
    sxy += w * x * z;
    used++;
  }
  if (used < 3)
    throw new RingdownFitError('The trace falls to the offset within fewer than 3 samples: sample faster or record a longer decay.');
  const slope = (sw * sxy - sx * sy) / (sw * sxx - sx * sx);
  if (!(slope < 0)) throw new RingdownFitError('The trace does not decay: the intensity does not fall after its start.');
  return { tau: -1 / slope, amplitude: Math.exp((sy - slope * sx) / sw) };
}

/** Sums of the Jacobian products at the solution: the entries of the symmetric JᵀJ for (A, τ, B). */
interface Normal {
  aa: number;
  as: number;
  ab: number;
  ss: number;
  sb: number;
  bb: number;
}

/** The (τ, τ) entry of (JᵀJ)⁻¹ by its cofactor; null when JᵀJ is singular (τ not determined). */
function tauVarianceFactor(m: Normal): number | null {
  const det = m.aa * (m.ss * m.bb - m.sb * m.sb) - m.as * (m.as * m.bb - m.sb * m.ab) + m.ab * (m.as * m.sb - m.ss * m.ab);
  if (!(det > 0) || !Number.isFinite(det)) return null;
  return (m.aa * m.bb - m.ab * m.ab) / det;
}

function binned(u: readonly number[], v: readonly number[]): { x: number[]; y: number[] } {
  const k = Math.ceil(u.length / MAX_OPTIMISER_POINTS);
  if (k === 1) return { x: [...u], y: [...v] };
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < u.length; i += k) {
    const end = Math.min(i + k, u.length);
    let su = 0;
    let sv = 0;
    for (let j = i; j < end; j++) {
      su += u[j] as number;
      sv += v[j] as number;
    }
    x.push(su / (end - i));
    y.push(sv / (end - i));
  }
  return { x, y };
}

/**
 * Fits the decay of a ring-down trace (times in s, strictly increasing). The fit works in scaled
 * variables (time in units of the first τ estimate, intensity in units of the first amplitude) so
 * that all three parameters are of order 1 for the optimiser. The uncertainty assumes independent
 * noise of one variance on every sample; an oversampled trace with correlated noise makes it too small.
 */
export function fitRingdown(points: readonly TracePoint[]): RingdownFit {
  if (points.length < MIN_RINGDOWN_POINTS) {
    throw new RingdownFitError(`A ring-down fit needs at least ${MIN_RINGDOWN_POINTS} points; the trace has ${points.length}.`);
  }
  const tailStart = Math.floor(points.length * (1 - TAIL_SHARE));
  const offset0 = mean(points.slice(Math.min(tailStart, points.length - 3)).map((p) => p.intensity));
  const start = decayStart(
    points.map((p) => p.intensity),
    offset0,
  );
  const window = points.slice(start);
  if (window.length < MIN_RINGDOWN_POINTS) {
    throw new RingdownFitError(`The decay starts only ${window.length} samples before the end of the trace; record more of the decay.`);
  }
  const t0 = (window[0] as TracePoint).timeS;
  const amplitude0 = (window[0] as TracePoint).intensity - offset0;
  if (!(amplitude0 > 0)) throw new RingdownFitError('The trace does not decay: its start is not above its tail.');

  const rawU = window.map((p) => p.timeS - t0);
  const guess = logLinear(
    rawU,
    window.map((p) => p.intensity),
    offset0,
    amplitude0,
  );
  const tauScale = guess.tau;
  const yScale = guess.amplitude;
  const u = rawU.map((x) => x / tauScale);
  const v = window.map((p) => (p.intensity - offset0) / yScale);

  const model =
    ([a, s, b]: number[]) =>
    (x: number) =>
      (a as number) * Math.exp(-x / (s as number)) + (b as number);
  const jacobian =
    ([a, s]: number[]) =>
    (x: number) => {
      const e = Math.exp(-x / (s as number));
      return [e, ((a as number) * x * e) / ((s as number) * (s as number)), 1];
    };
  const result = levenbergMarquardt(binned(u, v), model, {
    initialValues: [1, 1, 0],
    jacobianFunction: jacobian,
    minValues: [0, TAU_RATIO_MIN, -10],
    maxValues: [100, TAU_RATIO_MAX, 10],
    maxIterations: 30,
  });
  const [a, s, b] = result.parameterValues as [number, number, number];
  if (![a, s, b].every(Number.isFinite) || s <= TAU_RATIO_MIN || s >= TAU_RATIO_MAX)
    throw new RingdownFitError('The exponential fit did not converge.');

  const f = model([a, s, b]);
  const grad = jacobian([a, s, b]);
  const m: Normal = { aa: 0, as: 0, ab: 0, ss: 0, sb: 0, bb: 0 };
  let ssr = 0;
  for (let k = 0; k < u.length; k++) {
    const x = u[k] as number;
    const r = (v[k] as number) - f(x);
    ssr += r * r;
    const [ja, js, jb] = grad(x) as [number, number, number];
    m.aa += ja * ja;
    m.as += ja * js;
    m.ab += ja * jb;
    m.ss += js * js;
    m.sb += js * jb;
    m.bb += jb * jb;
  }
  const n = u.length;
  const factor = tauVarianceFactor(m);
  if (factor === null) throw new RingdownFitError('The decay time is not determined by this trace (singular fit).');
  const tauS = s * tauScale;
  const tauUncertaintyS = Math.sqrt((ssr / (n - 3)) * factor) * tauScale;

  const span = (window[window.length - 1] as TracePoint).timeS - t0;
  const curve: TracePoint[] = Array.from({ length: CURVE_SAMPLES }, (_, i) => {
    const dt = (span * i) / (CURVE_SAMPLES - 1);
    return { timeS: t0 + dt, intensity: offset0 + yScale * f(dt / tauScale) };
  });
  return {
    tauS,
    tauUncertaintyS,
    amplitude: a * yScale,
    offset: offset0 + b * yScale,
    residualRms: Math.sqrt(ssr / n) * yScale,
    pointsFitted: n,
    fitStartS: t0,
    curve,
  };
}

/**
 * Round-trip loss, per-mirror loss and finesse for the cavity length (form 1.10 via the fit
 * engine's lossFromRingdown). Loss ∝ 1/τ and finesse ∝ τ, so each carries the relative
 * uncertainty of τ to first order.
 */
export function ringdownFigures(fit: Pick<RingdownFit, 'tauS' | 'tauUncertaintyS'>, lengthM: number, groupIndex?: number): RingdownFigures {
  const loss = lossFromRingdown(groupIndex === undefined ? { lengthM, tauS: fit.tauS } : { lengthM, tauS: fit.tauS, groupIndex });
  const rel = fit.tauUncertaintyS / fit.tauS;
  return {
    lengthM,
    groupIndex: groupIndex ?? 1,
    roundTripLoss: { value: loss.roundTripLoss, uncertainty: loss.roundTripLoss * rel },
    perMirrorLoss: { value: loss.perMirrorLoss, uncertainty: loss.perMirrorLoss * rel },
    finesse: { value: loss.finesse, uncertainty: loss.finesse * rel },
  };
}
