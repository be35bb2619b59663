// Squeezed light: beam-splitter loss, efficiency budget, degenerate OPO spectrum below threshold,
// phase noise, and the efficiency a measured target needs (physics.md A5 forms 5.1–5.7, A12.4).
// Sources: M. J. Collett and C. W. Gardiner, Phys. Rev. A 30, 1386 (1984); L.-A. Wu et al.,
// J. Opt. Soc. Am. B 4, 1465 (1987); E. S. Polzik et al., Appl. Phys. B 55, 279 (1992) (form 5.6
// with x and Ω/γ); J. Appel et al., "Electronic noise in optical homodyne tomography", Phys. Rev. A
// 75, 035802 (2007) (electronic efficiency); LIGO Hanford aLOG 43785 (2018) (NLG and phase-noise
// fit convention).

import { FitInputError } from './errors';
import { efficiency, finite, finiteResult, nonNegative, positive, powerFraction } from './validate';

export interface Feasible {
  feasible: boolean;
  /** The efficiency the formula asks for; above 1 when infeasible. */
  efficiency: number;
  reason: string | null;
}

export interface OpoInput {
  /** x = √(P_pump/P_threshold), 0 ≤ x < 1. */
  pumpParameter: number;
  /** Ω/γ_c = sideband frequency / (cavity FWHM/2). */
  omegaOverGamma: number;
  /** Total detection efficiency, escape efficiency included. */
  efficiency: number;
  /** Fixed quadrature angle offset θ (form 5.7). */
  phaseNoiseRad?: number;
}

export interface Quadratures {
  /** Squeezing −10·log10(V−), positive when below shot noise. */
  squeezedDb: number;
  /** Anti-squeezing +10·log10(V+). */
  antiSqueezedDb: number;
  /** Measured variances, phase offset applied (5.7). */
  vMinus: number;
  vPlus: number;
}

export type ElectronicNoiseInput = { clearanceDb: number } | { shotToDarkRatio: number };

/** Form 5.2: a squeezing in dB (positive = below shot noise) as a variance. */
export function varianceFromDb(db: number): number {
  return finiteResult('db', Math.pow(10, -finite('db', db) / 10), 'variance');
}

function dbFromVariance(field: string, v: number): number {
  return finiteResult(field, -10 * Math.log10(v), 'squeezing in dB') + 0;
}

function squeezingDb(field: string, v: unknown): number {
  return positive(field, v);
}

/** Form 5.1, beam-splitter loss: V_meas = η·V + (1 − η). */
export function lossyVariance(input: { variance: number; efficiency: number }): number {
  const v = positive('variance', input.variance);
  const eta = efficiency('efficiency', input.efficiency);
  return finiteResult('variance', eta * v + (1 - eta), 'variance');
}

/** Form 5.3, best measurable squeezing −10·log10(1 − η); unbounded at η = 1. */
export function maxSqueezingDb(input: { efficiency: number }): { squeezingDb: number | null; unbounded: boolean } {
  const eta = efficiency('efficiency', input.efficiency);
  if (eta === 1) return { squeezingDb: null, unbounded: true };
  return { squeezingDb: dbFromVariance('efficiency', 1 - eta), unbounded: false };
}

function feasibility(required: number, what: string): Feasible {
  if (required > 1) {
    return {
      feasible: false,
      efficiency: required,
      reason: `${what} would need an efficiency of ${required.toFixed(4)}, above 1`,
    };
  }
  return { feasible: true, efficiency: required, reason: null };
}

/** Form 5.4: η_req = (1 − V_target)/(1 − V_initial); infinite initial squeezing when initialDb is omitted. */
export function requiredEfficiency(input: { targetDb: number; initialDb?: number }): Feasible {
  const target = squeezingDb('targetDb', input.targetDb);
  const initial = input.initialDb === undefined ? undefined : squeezingDb('initialDb', input.initialDb);
  const numerator = -Math.expm1((-target / 10) * Math.LN10);
  const denominator = initial === undefined ? 1 : -Math.expm1((-initial / 10) * Math.LN10);
  return feasibility(finiteResult('initialDb', numerator / denominator, 'required efficiency'), `${target} dB measured`);
}

/**
 * Form 5.5c: η_el = 1 − 10^(−C/10) for the clearance C seen on the analyser (shot trace including
 * dark noise over the dark trace), or s/(1 + s) for a dark-subtracted ratio s = N_shot/N_el.
 */
export function electronicEfficiency(input: ElectronicNoiseInput): number {
  if ('clearanceDb' in input) {
    const c = positive('clearanceDb', input.clearanceDb);
    return -Math.expm1((-c / 10) * Math.LN10);
  }
  const s = positive('shotToDarkRatio', input.shotToDarkRatio);
  return s / (1 + s);
}

/** Form 5.5a: η_esc = T_oc/(T_oc + L_int). */
export function escapeEfficiency(input: { outputCoupler: number; internalLoss: number }): number {
  const t = powerFraction('outputCoupler', input.outputCoupler);
  if (t === 0) throw new FitInputError('outputCoupler', 'must be greater than 0: nothing escapes otherwise');
  const l = powerFraction('internalLoss', input.internalLoss);
  return t / (t + l);
}

/** Form 5.5: η = η_esc · η_prop · V_vis² · η_QE · η_el. */
export function totalEfficiency(input: {
  escape: number;
  propagation: number;
  visibility: number;
  quantumEfficiency: number;
  electronic: number;
}): number {
  const v = efficiency('visibility', input.visibility);
  return (
    efficiency('escape', input.escape) *
    efficiency('propagation', input.propagation) *
    v *
    v *
    efficiency('quantumEfficiency', input.quantumEfficiency) *
    efficiency('electronic', input.electronic)
  );
}

function pumpParameter(v: unknown): number {
  const x = nonNegative('pumpParameter', v);
  if (x >= 1) throw new FitInputError('pumpParameter', `must be below 1 (threshold), got ${x}`);
  return x;
}

function phaseOffset(v: number | undefined): number {
  return v === undefined ? 0 : finite('phaseNoiseRad', v);
}

/**
 * Form 5.6 without phase: V∓ = 1 ∓ η·4x/[(1 ± x)² + (Ω/γ_c)²]. V− is written as
 * [(1 − x)² + (Ω/γ_c)² + 4x(1 − η)]/[(1 + x)² + (Ω/γ_c)²], the same value without the cancellation
 * that would round it to 0 near threshold.
 */
function opoVariances(x: number, w: number, eta: number): { vm: number; vp: number } {
  // Far outside the cavity line both quadratures are at shot noise; capping (Ω/γ_c)² keeps that
  // limit exact instead of ∞/∞.
  const w2 = Math.min(w * w, 1e300);
  return {
    vm: ((1 - x) * (1 - x) + w2 + 4 * x * (1 - eta)) / ((1 + x) * (1 + x) + w2),
    vp: 1 + (eta * 4 * x) / ((1 - x) * (1 - x) + w2),
  };
}

/** Form 5.7, fixed angle: V_θ = V−·cos²θ + V+·sin²θ, and the swapped form for the other quadrature. */
function rotate(vm: number, vp: number, theta: number): { vMinus: number; vPlus: number } {
  const c2 = Math.cos(theta) ** 2;
  const s2 = 1 - c2;
  return { vMinus: vm * c2 + vp * s2, vPlus: vp * c2 + vm * s2 };
}

/** Forms 5.6 and 5.7: measured squeezed and anti-squeezed quadratures of a degenerate OPO. */
export function opoQuadratures(input: OpoInput): Quadratures {
  const x = pumpParameter(input.pumpParameter);
  const w = nonNegative('omegaOverGamma', input.omegaOverGamma);
  const eta = efficiency('efficiency', input.efficiency);
  const { vm, vp } = opoVariances(x, w, eta);
  const { vMinus, vPlus } = rotate(vm, vp, phaseOffset(input.phaseNoiseRad));
  return {
    squeezedDb: dbFromVariance('pumpParameter', vMinus),
    antiSqueezedDb: 10 * Math.log10(vPlus) + 0,
    vMinus,
    vPlus,
  };
}

/** Largest pump parameter the scan tries; the linearised model has no meaning at threshold. */
const MAX_PUMP = 0.9999;
const GOLDEN = (Math.sqrt(5) - 1) / 2;

/**
 * The pump parameter with the most measured squeezing under a fixed phase offset (5.6, 5.7). With
 * phase noise the anti-squeezed quadrature leaks in and grows as x → 1, so there is an optimum;
 * physics.md A5 asks for a scan rather than assuming x → 1. Coarse grid, then golden-section refinement.
 */
export function optimumPump(input: { efficiency: number; phaseNoiseRad: number; omegaOverGamma?: number }): {
  pumpParameter: number;
  squeezedDb: number;
} {
  const eta = efficiency('efficiency', input.efficiency);
  const theta = finite('phaseNoiseRad', input.phaseNoiseRad);
  const w = input.omegaOverGamma === undefined ? 0 : nonNegative('omegaOverGamma', input.omegaOverGamma);
  const measured = (x: number): number => {
    const { vm, vp } = opoVariances(x, w, eta);
    return rotate(vm, vp, theta).vMinus;
  };
  const steps = 1000;
  let bestX = 0;
  let bestV = measured(0);
  for (let i = 1; i <= steps; i++) {
    const x = (MAX_PUMP * i) / steps;
    const v = measured(x);
    if (v < bestV) {
      bestV = v;
      bestX = x;
    }
  }
  let lo = Math.max(0, bestX - MAX_PUMP / steps);
  let hi = Math.min(MAX_PUMP, bestX + MAX_PUMP / steps);
  for (let k = 0; k < 60; k++) {
    const a = hi - GOLDEN * (hi - lo);
    const b = lo + GOLDEN * (hi - lo);
    if (measured(a) < measured(b)) hi = b;
    else lo = a;
  }
  const refinedX = (lo + hi) / 2;
  const refinedV = measured(refinedX);
  if (refinedV < bestV) {
    bestV = refinedV;
    bestX = refinedX;
  }
  return { pumpParameter: bestX, squeezedDb: dbFromVariance('phaseNoiseRad', bestV) };
}

export type SqueezingSource = { initialDb: number; antiSqueezingDb?: number } | { pumpParameter: number; omegaOverGamma: number };

/** Measured quadratures as V−(η) = 1 − η·squeezed and V+(η) = 1 + η·antiSqueezed. */
export interface SourceSlopes {
  squeezed: number;
  antiSqueezed: number;
}

/**
 * How much the source moves each measured quadrature per unit total efficiency η, with the fixed
 * phase offset θ. Loss (5.1) mixes in vacuum linearly, V(η) = η·V + 1 − η, so each quadrature is
 * 1 ∓ η·slope. For an initial state (V−, V+; pure, V+ = 1/V−, unless antiSqueezingDb is given)
 * rotated by θ (5.7); for the OPO the 5.6 terms at η = 1, rotated. No squeezing is visible when
 * `squeezed` ≤ 0.
 */
export function sourceSlopes(input: { source: SqueezingSource; phaseNoiseRad?: number }): SourceSlopes {
  const theta = phaseOffset(input.phaseNoiseRad);
  const source = input.source;
  let vm: number;
  let vp: number;
  if ('initialDb' in source) {
    vm = varianceFromDb(squeezingDb('source.initialDb', source.initialDb));
    vp = source.antiSqueezingDb === undefined ? 1 / vm : 1 / varianceFromDb(squeezingDb('source.antiSqueezingDb', source.antiSqueezingDb));
  } else {
    ({ vm, vp } = opoVariances(pumpParameter(source.pumpParameter), nonNegative('source.omegaOverGamma', source.omegaOverGamma), 1));
  }
  const r = rotate(vm, finiteResult('source', vp, 'anti-squeezed variance'), theta);
  return {
    squeezed: finiteResult('source', 1 - r.vMinus, 'squeezing'),
    antiSqueezed: finiteResult('source', r.vPlus - 1, 'anti-squeezing'),
  };
}

/**
 * Form 12.4: the photodiode quantum efficiency a measured target needs,
 * η_QE,req = η_req/(η_esc·η_prop·V_vis²·η_el). η_req is 5.4 for an initial squeezing (infinite when
 * neither initialDb nor opo is given), or 5.6/5.7 for an OPO; with a phase offset, V_meas = 1 − η·k
 * (sourceSlopes) is solved for η. Infeasible when η_req or η_QE,req exceeds 1.
 */
export function requiredDetectorEfficiency(input: {
  targetDb: number;
  initialDb?: number;
  antiSqueezingDb?: number;
  opo?: { pumpParameter: number; omegaOverGamma: number };
  phaseNoiseRad?: number;
  escape: number;
  propagation: number;
  visibility: number;
  clearanceDb: number;
}): Feasible & { totalRequired: number } {
  const target = squeezingDb('targetDb', input.targetDb);
  const v = efficiency('visibility', input.visibility);
  const chain =
    efficiency('escape', input.escape) *
    efficiency('propagation', input.propagation) *
    v *
    v *
    electronicEfficiency({ clearanceDb: input.clearanceDb });
  let k = 1;
  if (input.opo !== undefined) {
    k = sourceSlopes({ source: input.opo, phaseNoiseRad: input.phaseNoiseRad }).squeezed;
  } else if (input.initialDb !== undefined) {
    const source =
      input.antiSqueezingDb === undefined
        ? { initialDb: input.initialDb }
        : { initialDb: input.initialDb, antiSqueezingDb: input.antiSqueezingDb };
    k = sourceSlopes({ source, phaseNoiseRad: input.phaseNoiseRad }).squeezed;
  } else if (phaseOffset(input.phaseNoiseRad) !== 0) {
    throw new FitInputError('phaseNoiseRad', 'a phase offset needs a finite source (initialDb or opo)');
  }
  if (k <= 0) {
    return {
      feasible: false,
      efficiency: 0,
      totalRequired: 0,
      reason: 'this source with this phase offset shows no squeezing at any efficiency',
    };
  }
  const totalRequired = finiteResult('targetDb', -Math.expm1((-target / 10) * Math.LN10) / k, 'required efficiency');
  const qe = finiteResult('clearanceDb', totalRequired / chain, 'required quantum efficiency');
  if (totalRequired > 1) {
    return {
      feasible: false,
      efficiency: qe,
      totalRequired,
      reason: `${target} dB measured needs a total efficiency of ${totalRequired.toFixed(4)}, above 1, even with a perfect detector`,
    };
  }
  const f = feasibility(qe, `${target} dB measured`);
  return { feasible: f.feasible, efficiency: f.efficiency, reason: f.reason, totalRequired };
}
