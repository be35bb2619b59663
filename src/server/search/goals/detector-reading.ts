/**
 * The squeezing goal's verdict for many detectors at search speed. A detector's specs are read and
 * checked once, as evaluateSqueezingGoal checks them; per search, the figure, worst case, verdict and
 * headroom follow the evaluator's own steps and arithmetic (src/lib/fit/goals/squeezing.ts), so the
 * ranking equals what the evaluator gives (tests/unit/search/rank-keys.test.ts compares them over
 * random catalogues). Pages still show the evaluator's full result.
 * Physics (physics.md A5, A12): η_el = s/(1 + s) with s = 2e·I/i_n², I = η_QE·(eλ/hc)·P_LO (12.2–12.3);
 * η = η_esc·η_prop·V²·η_QE·η_el; measured V− = 1 − η·k from the source slopes (5.1, 5.6–5.7).
 * Sources: Appel et al., Phys. Rev. A 75, 035802 (2007); Collett & Gardiner, Phys. Rev. A 30, 1386 (1984).
 */
import {
  ELEMENTARY_CHARGE,
  FitInputError,
  interpolateCurve,
  PLANCK,
  SPEED_OF_LIGHT,
  sourceSlopes,
  type CurvePoint,
  type PhotodiodeSpec,
  type SqueezingGoal,
} from '../../../lib/fit';
import { nearWavelength, readCurve, spread, type Spread } from '../../../lib/fit/goals/spec';
import { headroomOf, verdictOf, worse } from '../../../lib/fit/goals/verdict';
import { efficiency, nonNegative, positive } from '../../../lib/fit/validate';
import { lerpSorted } from './lerp';
import { BLOCKED, VERDICT_RANK, type RankKey } from './rank';

export interface DetectorReading {
  curve: CurvePoint[] | null;
  /** The wavelength the quoted QE or responsivity refers to. */
  at: number | null;
  qe: Spread | null;
  responsivity: Spread | null;
  /** The QE a quoted responsivity means at `at`; 'refused' when above 1 (the evaluator refuses it where it needs it). */
  qeFromResponsivity: Spread | 'refused' | null;
  noise: Spread | null;
  nep: number | null;
  bandwidthHz: number;
  saturationW: number | null;
}

/** Responsivity per unit quantum efficiency at λ, e·λ/(h·c), A/W. */
function responsivityPerQe(lambdaM: number): number {
  return (ELEMENTARY_CHARGE * lambdaM) / (PLANCK * SPEED_OF_LIGHT);
}

/** The detector's specs, checked as the evaluator checks them; null when it would refuse them. */
export function readDetector(d: PhotodiodeSpec): DetectorReading | null {
  try {
    const bandwidthHz = positive('detector.bandwidthHz', d.bandwidthHz);
    const saturationW = d.saturationPowerW === undefined ? null : positive('detector.saturationPowerW', d.saturationPowerW);
    if (d.cmrrDb !== undefined) nonNegative('detector.cmrrDb', d.cmrrDb);
    const curve =
      d.qeCurve === undefined ? null : readCurve('detector.qeCurve', d.qeCurve, 'wavelengthNm', 'qe', efficiency).sort((a, b) => a.x - b.x);
    // the engine's own check (finite points, no two at one wavelength), once
    if (curve !== null) interpolateCurve('detector.qeCurve', curve, curve[0]?.x ?? 0);
    const at = d.wavelengthNm === undefined ? null : positive('detector.wavelengthNm', d.wavelengthNm);
    let qe: Spread | null = null;
    if (d.quantumEfficiency !== undefined) {
      qe = spread('detector.quantumEfficiency', d.quantumEfficiency, 1);
      efficiency('detector.quantumEfficiency.value', qe.nominal);
    }
    const responsivity = d.responsivityAW === undefined ? null : spread('detector.responsivityAW', d.responsivityAW);
    let qeFromResponsivity: DetectorReading['qeFromResponsivity'] = null;
    if (responsivity !== null && at !== null) {
      const k = 1 / responsivityPerQe(at * 1e-9);
      const nominal = responsivity.nominal * k;
      qeFromResponsivity =
        nominal > 0 && nominal <= 1 ? { nominal, low: responsivity.low * k, high: Math.min(1, responsivity.high * k) } : 'refused';
    }
    let noise: Spread | null = null;
    let nep: number | null = null;
    if (d.noiseCurrentAPerRtHz !== undefined) {
      noise = spread('detector.noiseCurrentAPerRtHz', d.noiseCurrentAPerRtHz);
      positive('detector.noiseCurrentAPerRtHz.value', noise.nominal);
    } else if (d.nepWPerRtHz !== undefined) {
      nep = positive('detector.nepWPerRtHz', d.nepWPerRtHz);
    }
    return { curve, at, qe, responsivity, qeFromResponsivity, noise, nep, bandwidthHz, saturationW };
  } catch (e) {
    if (e instanceof FitInputError) return null;
    throw e;
  }
}

/** The goal's detector-independent terms, as evaluateSqueezingGoal derives them. */
export interface SqueezingTerms {
  lambdaNm: number;
  perQe: number;
  loPowerW: number;
  sidebandHz: number;
  targetDb: number;
  chain: number;
  /** Squeezed-quadrature slope k: V− = 1 − η·k. */
  k: number;
}

/** The goal must already have passed the evaluator once (squeezingQuery), so it is not checked again. */
export function squeezingTerms(goal: SqueezingGoal): SqueezingTerms {
  const s = goal.source;
  const source =
    s.kind === 'initial'
      ? s.antiSqueezingDb === undefined
        ? { initialDb: s.initialDb }
        : { initialDb: s.initialDb, antiSqueezingDb: s.antiSqueezingDb }
      : { pumpParameter: s.pumpParameter, omegaOverGamma: goal.sidebandHz / (s.linewidthHz / 2) };
  const v = goal.visibility;
  return {
    lambdaNm: goal.wavelengthNm,
    perQe: responsivityPerQe(goal.wavelengthNm * 1e-9),
    loPowerW: goal.loPowerW,
    sidebandHz: goal.sidebandHz,
    targetDb: goal.targetDb,
    chain: goal.escapeEfficiency * goal.propagationEfficiency * v * v,
    k: sourceSlopes({ source, phaseNoiseRad: goal.phaseNoiseRad ?? 0 }).squeezed,
  };
}

/** The evaluator's order: a curve covering the wavelength, else the spec's QE or responsivity quoted within 1 nm. */
function quantumEfficiencyAt(r: DetectorReading, lambdaNm: number): Spread | 'refused' | null {
  if (r.curve !== null) {
    const qe = lerpSorted(r.curve, lambdaNm);
    if (qe !== null) return { nominal: qe, low: qe, high: qe };
  }
  if (r.at === null || !nearWavelength(r.at, lambdaNm)) return null;
  return r.qe ?? r.qeFromResponsivity;
}

/** Form 12.3, η_el = s/(1 + s); NaN when s is not representable (the evaluator refuses those). */
function electronicEta(qe: number, perQe: number, loPowerW: number, noise: number): number {
  const s = (2 * ELEMENTARY_CHARGE * qe * perQe * loPowerW) / noise / noise;
  return Number.isFinite(s) ? s / (1 + s) : NaN;
}

function db(v: number): number {
  return -10 * Math.log10(v) + 0;
}

export interface DetectorFigures extends RankKey {
  figure: number;
  worst: number;
}

/** Figure, worst case, verdict and headroom as evaluateSqueezingGoal gives them; null when it gives no figure. */
export function detectorFigures(t: SqueezingTerms, r: DetectorReading): DetectorFigures | null {
  const qe = quantumEfficiencyAt(r, t.lambdaNm);
  if (qe === null || qe === 'refused') return null;
  let noise = r.noise;
  if (noise === null && r.nep !== null) {
    const n = r.nep * qe.nominal * t.perQe;
    noise = { nominal: n, low: n, high: n };
  }
  const elNominal = noise === null ? 1 : electronicEta(qe.nominal, t.perQe, t.loPowerW, noise.nominal);
  const elWorst = noise === null ? 1 : electronicEta(qe.low, t.perQe, t.loPowerW, noise.high);
  if (Number.isNaN(elNominal) || Number.isNaN(elWorst)) return null;
  const figure = db(1 - t.chain * qe.nominal * elNominal * t.k);
  const worst = db(1 - t.chain * qe.low * elWorst * t.k);
  if (r.bandwidthHz < t.sidebandHz || (r.saturationW !== null && r.saturationW < t.loPowerW))
    return { figure, worst, rank: 0, headroom: null };
  let verdict = verdictOf(figure, worst, t.targetDb, 'higher-db');
  if (noise === null) verdict = worse(verdict, 'marginal');
  return { figure, worst, rank: VERDICT_RANK[verdict], headroom: headroomOf(worst, t.targetDb, 'higher-db') };
}

export function detectorKey(t: SqueezingTerms, r: DetectorReading | null): RankKey {
  if (r === null) return BLOCKED;
  return detectorFigures(t, r) ?? BLOCKED;
}
