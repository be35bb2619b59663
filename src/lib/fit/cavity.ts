// Fabry–Perot cavity: finesse, free spectral range, linewidth, storage time, Q, inverse design,
// resonant transmission and build-up (physics.md A1, forms 1.1–1.13).
// Sources: E. Hecht, "Optics", 5th ed. (2017), §9.6 (coefficient of finesse, finesse);
// B. E. A. Saleh and M. C. Teich, "Fundamentals of Photonics", 2nd ed. (2007), ch. 10 (photon
// lifetime, linewidth); A. E. Siegman, "Lasers" (1986), ch. 11; the strict FWHM form 1.4 is the
// exact half-maximum of the Airy transmission function.

import { SPEED_OF_LIGHT } from './constants';
import { FitInputError } from './errors';
import { finiteResult, positive, powerFraction } from './validate';

export interface MirrorPairInput {
  r1: number;
  r2: number;
  /** Extra round-trip power loss inside the cavity (not counted in r1, r2). */
  extraLoss?: number;
}

export interface LowLossInput {
  t1: number;
  t2: number;
  a1?: number;
  a2?: number;
  extraLoss?: number;
}

export interface TransmissionPairInput {
  t1: number;
  t2: number;
  /** Round-trip loss other than the two transmissions (mirror absorption and scatter included). */
  extraLoss?: number;
}

export interface CavityLengthInput {
  lengthM: number;
  groupIndex?: number;
}

export interface CavityFinesseInput extends CavityLengthInput {
  finesse: number;
}

export interface RequiredReflectivity {
  feasible: boolean;
  /** The other mirror's R (symmetric pair: each mirror's R). Above 1 when infeasible. */
  reflectivity: number;
  /** Allowed T + A for that mirror, 1 − R; zero or negative when infeasible. */
  lossBudget: number;
  reason: string | null;
}

export interface LossBudget {
  feasible: boolean;
  /** Allowed T + A per mirror (symmetric) or for mirror 2. */
  lossBudget: number;
  reason: string | null;
}

export interface RingdownLoss {
  /** Total round-trip power loss 𝓛 = t_rt/τ (1.10). */
  roundTripLoss: number;
  /** Per-mirror loss 1 − R for a symmetric pair with all loss in the mirrors. */
  perMirrorLoss: number;
  finesse: number;
}

function extraLossOf(v: number | undefined): number {
  return v === undefined ? 0 : powerFraction('extraLoss', v);
}

function groupIndexOf(v: number | undefined): number {
  return v === undefined ? 1 : positive('groupIndex', v);
}

/**
 * Finesse (1.3) from ln ρ. Working in logs keeps 1 − √ρ accurate when the losses are at the ppm
 * level (expm1 avoids the cancellation in 1 − √ρ).
 */
function finesseFromLogRho(lnRho: number): number {
  return (Math.PI * Math.exp(lnRho / 4)) / -Math.expm1(lnRho / 2);
}

function logRho(r1: number, r2: number, extraLoss: number): number {
  return Math.log(r1) + Math.log(r2) + Math.log1p(-extraLoss);
}

/** Form 1.3, the standard finesse ℱ = π·ρ^¼/(1 − √ρ) with ρ = R1·R2·(1 − L_rt) (1.1). */
export function finesse(input: MirrorPairInput): number {
  const r1 = powerFraction('r1', input.r1);
  const r2 = powerFraction('r2', input.r2);
  return finiteResult('r1', finesseFromLogRho(logRho(r1, r2, extraLossOf(input.extraLoss))), 'finesse');
}

/**
 * Form 1.3 from each mirror's total loss ℓ_i = T_i + A_i (R_i = 1 − ℓ_i), computed without
 * forming R_i so that ppm losses keep full precision.
 */
export function finesseFromMirrorLosses(input: { loss1: number; loss2: number; extraLoss?: number }): number {
  const loss1 = powerFraction('loss1', input.loss1);
  const loss2 = powerFraction('loss2', input.loss2);
  const extraLoss = extraLossOf(input.extraLoss);
  const lnRho = Math.log1p(-loss1) + Math.log1p(-loss2) + Math.log1p(-extraLoss);
  if (lnRho === 0) throw new FitInputError('loss1', 'a cavity with no loss at all has no finite finesse');
  return finiteResult('loss1', finesseFromLogRho(lnRho), 'finesse');
}

/** Form 1.2, coefficient of finesse F_c = 4√ρ/(1 − √ρ)². */
export function coefficientOfFinesse(input: MirrorPairInput): number {
  const r1 = powerFraction('r1', input.r1);
  const r2 = powerFraction('r2', input.r2);
  const lnRho = logRho(r1, r2, extraLossOf(input.extraLoss));
  const oneMinusSqrt = -Math.expm1(lnRho / 2);
  return finiteResult('r1', (4 * Math.exp(lnRho / 2)) / oneMinusSqrt / oneMinusSqrt, 'coefficient of finesse');
}

/**
 * Form 1.4, the strict FWHM finesse π/(2·arcsin[(1 − √ρ)/(2ρ^¼)]). Below ρ = (√2 − 1)⁴ ≈ 0.0294 the
 * Airy peak never falls to half its maximum, so no FWHM exists.
 */
export function finesseFwhm(input: MirrorPairInput): number {
  const r1 = powerFraction('r1', input.r1);
  const r2 = powerFraction('r2', input.r2);
  const lnRho = logRho(r1, r2, extraLossOf(input.extraLoss));
  const arg = -Math.expm1(lnRho / 2) / (2 * Math.exp(lnRho / 4));
  if (!(arg <= 1)) {
    throw new FitInputError(
      'r1',
      'R1·R2·(1 − extraLoss) is below 0.0294: the transmission peak never falls to half maximum, so the FWHM finesse is undefined',
    );
  }
  return finiteResult('r1', Math.PI / (2 * Math.asin(arg)), 'FWHM finesse');
}

/** Form 1.5, the low-loss approximation ℱ ≈ 2π/𝓛 with 𝓛 = T1 + T2 + A1 + A2 + L_rt. */
export function finesseLowLoss(input: LowLossInput): number {
  const total =
    powerFraction('t1', input.t1) +
    powerFraction('t2', input.t2) +
    (input.a1 === undefined ? 0 : powerFraction('a1', input.a1)) +
    (input.a2 === undefined ? 0 : powerFraction('a2', input.a2)) +
    extraLossOf(input.extraLoss);
  if (total === 0) throw new FitInputError('t1', 'total round-trip loss is 0: the finesse is unbounded');
  return finiteResult('t1', (2 * Math.PI) / total, 'low-loss finesse');
}

/** Form 1.6, linear cavity FSR = c/(2·n_g·L), Hz. */
export function freeSpectralRange(input: CavityLengthInput): number {
  const lengthM = positive('lengthM', input.lengthM);
  const n = groupIndexOf(input.groupIndex);
  return finiteResult('lengthM', SPEED_OF_LIGHT / (2 * n * lengthM), 'free spectral range');
}

/** Form 1.7, FWHM linewidth Δν = FSR/ℱ, Hz. */
export function cavityLinewidth(input: CavityFinesseInput): number {
  const f = positive('finesse', input.finesse);
  return finiteResult('finesse', freeSpectralRange(input) / f, 'linewidth');
}

/** Form 1.7, cavity pole (HWHM) f_p = Δν_FWHM/2, Hz. */
export function cavityPole(input: CavityFinesseInput): number {
  return cavityLinewidth(input) / 2;
}

/** Form 1.8, intensity (energy) 1/e storage time τ = ℱ/(2π·FSR), s. */
export function storageTime(input: CavityFinesseInput): number {
  const f = positive('finesse', input.finesse);
  return finiteResult('finesse', f / (2 * Math.PI * freeSpectralRange(input)), 'storage time');
}

/** Form 1.8c, field (amplitude) decay time 2τ, s. */
export function fieldDecayTime(input: CavityFinesseInput): number {
  return finiteResult('finesse', 2 * storageTime(input), 'field decay time');
}

/** Form 1.9, Q = ν0/Δν_FWHM with ν0 = c/λ (vacuum wavelength). */
export function qualityFactor(input: { wavelengthM: number; linewidthHz: number }): number {
  const wavelengthM = positive('wavelengthM', input.wavelengthM);
  const linewidthHz = positive('linewidthHz', input.linewidthHz);
  return finiteResult('linewidthHz', SPEED_OF_LIGHT / wavelengthM / linewidthHz, 'quality factor');
}

/**
 * Form 1.11, u = ρ^¼ for a target finesse, as 1 − u = 2π/(2ℱ + π + √(π² + 4ℱ²)): the same root as
 * (−π + √(π² + 4ℱ²))/(2ℱ), rearranged so that 1 − u keeps full precision at high finesse.
 */
function oneMinusU(f: number): number {
  return (2 * Math.PI) / (2 * f + Math.PI + Math.hypot(Math.PI, 2 * f));
}

/**
 * Form 1.11, the reflectivity the other mirror needs for a target finesse (form 1.3). Without r1:
 * a symmetric pair, R = u²/√(1 − L_rt). With r1: R2 = u⁴/(R1·(1 − L_rt)); infeasible when that
 * reaches 1 (mirror 1 and the extra loss already use up the budget).
 */
export function requiredReflectivity(input: { finesse: number; r1?: number; extraLoss?: number }): RequiredReflectivity {
  const f = positive('finesse', input.finesse);
  const extraLoss = extraLossOf(input.extraLoss);
  const d = oneMinusU(f);
  const oneMinusU2 = d * (2 - d);
  let budget: number;
  if (input.r1 === undefined) {
    const s = Math.sqrt(1 - extraLoss);
    budget = (s - 1 + oneMinusU2) / s;
  } else {
    const r1 = powerFraction('r1', input.r1);
    const survival = r1 * (1 - extraLoss);
    if (survival === 0) {
      return {
        feasible: false,
        reflectivity: 1,
        lossBudget: 0,
        reason: 'mirror 1 reflects nothing: no second mirror reaches any finesse',
      };
    }
    const oneMinusU4 = oneMinusU2 * (2 - oneMinusU2);
    budget = (oneMinusU4 - (1 - survival)) / survival;
  }
  const reflectivity = finiteResult('finesse', 1 - budget, 'required reflectivity');
  if (budget <= 0) {
    return {
      feasible: false,
      reflectivity,
      lossBudget: budget,
      reason:
        input.r1 === undefined
          ? `the extra loss alone limits the finesse below ${f}`
          : `mirror 1 and the extra loss alone limit the finesse below ${f}`,
    };
  }
  return { feasible: true, reflectivity, lossBudget: budget, reason: null };
}

/**
 * Form 1.11a, low-loss inverse: T2 + A2 ≤ 2π/ℱ − T1 − A1 − L_rt. Without loss1 (= T1 + A1) the
 * budget is shared equally by a symmetric pair.
 */
export function lossBudgetLowLoss(input: { finesse: number; loss1?: number; extraLoss?: number }): LossBudget {
  const f = positive('finesse', input.finesse);
  const extraLoss = extraLossOf(input.extraLoss);
  const total = finiteResult('finesse', (2 * Math.PI) / f, 'loss budget');
  const budget = input.loss1 === undefined ? (total - extraLoss) / 2 : total - powerFraction('loss1', input.loss1) - extraLoss;
  if (budget <= 0) {
    return { feasible: false, lossBudget: budget, reason: `the other losses alone limit the finesse below ${f}` };
  }
  return { feasible: true, lossBudget: budget, reason: null };
}

/**
 * Form 1.10, loss from a measured intensity ring-down τ: 𝓛 = 2·n_g·L/(c·τ), symmetric per-mirror
 * 1 − R = n_g·L/(c·τ), ℱ = π·c·τ/(n_g·L). Valid for τ ≫ t_rt; a τ that implies 𝓛 ≥ 1 is rejected.
 */
export function lossFromRingdown(input: { lengthM: number; tauS: number; groupIndex?: number }): RingdownLoss {
  const lengthM = positive('lengthM', input.lengthM);
  const tauS = positive('tauS', input.tauS);
  const n = groupIndexOf(input.groupIndex);
  const perMirrorLoss = (n * lengthM) / SPEED_OF_LIGHT / tauS;
  const roundTripLoss = 2 * perMirrorLoss;
  if (!(roundTripLoss < 1)) {
    throw new FitInputError('tauS', 'ring-down time is not longer than the round-trip time; form 1.10 needs τ ≫ 2·n_g·L/c');
  }
  return {
    roundTripLoss,
    perMirrorLoss,
    finesse: finiteResult('tauS', (Math.PI * SPEED_OF_LIGHT * tauS) / (n * lengthM), 'finesse'),
  };
}

/** 1 − √ρ for R_i = 1 − T_i and the extra loss, without cancellation. */
function oneMinusSqrtRho(t1: number, t2: number, extraLoss: number): number {
  return -Math.expm1((Math.log1p(-t1) + Math.log1p(-t2) + Math.log1p(-extraLoss)) / 2);
}

function transmissionPair(input: TransmissionPairInput): { t1: number; t2: number; extraLoss: number; d: number } {
  const t1 = powerFraction('t1', input.t1);
  const t2 = powerFraction('t2', input.t2);
  const extraLoss = extraLossOf(input.extraLoss);
  const d = oneMinusSqrtRho(t1, t2, extraLoss);
  if (d === 0) throw new FitInputError('t1', 'no transmission and no loss: the cavity has no defined response');
  return { t1, t2, extraLoss, d };
}

/** Form 1.12, on-resonance transmission (mode-matched) T1·T2·√(1 − L_rt)/(1 − √ρ)². */
export function resonantTransmission(input: TransmissionPairInput): number {
  const { t1, t2, extraLoss, d } = transmissionPair(input);
  return finiteResult('t1', (t1 / d) * (t2 / d) * Math.sqrt(1 - extraLoss), 'resonant transmission');
}

/** Form 1.13, circulating-power build-up P_circ/P_in = T1/(1 − √ρ)². */
export function buildUp(input: TransmissionPairInput): number {
  const { t1, d } = transmissionPair(input);
  return finiteResult('t1', t1 / d / d, 'build-up');
}
