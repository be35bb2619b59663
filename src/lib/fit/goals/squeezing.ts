// Squeezing goal: predicted measured squeezing with a candidate photodiode or balanced detector,
// and the quantum efficiency the buyer's budget demands (physics.md A5 forms 5.1, 5.5–5.7; A12
// forms 12.1–12.6).
// Sources: M. J. Collett and C. W. Gardiner, Phys. Rev. A 30, 1386 (1984); E. S. Polzik et al.,
// Appl. Phys. B 55, 279 (1992); J. Appel et al., "Electronic noise in optical homodyne tomography",
// Phys. Rev. A 75, 035802 (2007); CODATA 2018 exact constants.

import { ELEMENTARY_CHARGE, PLANCK, SPEED_OF_LIGHT } from '../constants';
import { FitInputError } from '../errors';
import { interpolateCurve } from '../interpolate';
import { sourceSlopes, type SqueezingSource } from '../squeezing';
import { efficiency, finite, finiteResult, nonNegative, oneOf, positive, requireObject } from '../validate';
import { fmt, formatHz, formatNm, formatWatts } from './format';
import { nearWavelength, readCurve, spread, type Spread } from './spec';
import type { PhotodiodeSpec, SqueezingGoal, SqueezingGoalResult } from './types';
import { headroomOf, verdictOf, worse } from './verdict';

const FORMULA =
  'V_meas = η·V_θ + (1 − η) with V_θ = V−cos²θ + V+sin²θ (initial state) or the OPO V∓ = 1 ∓ η·4x/[(1 ± x)² + (Ω/γ_c)²], Ω/γ_c = f/(Δν/2); η = η_esc·η_prop·V_vis²·η_QE·η_el; η_el = s/(1 + s), s = 2eI/i_n², I = ℜ·P_LO; required η_QE = η_req/(η_esc·η_prop·V_vis²·η_el)';
const SOURCE =
  'Collett & Gardiner, PRA 30, 1386 (1984); Polzik et al., Appl. Phys. B 55, 279 (1992); Appel et al., PRA 75, 035802 (2007) (physics.md A5 forms 5.1, 5.5–5.7; A12 forms 12.1–12.4)';

/** Responsivity per unit quantum efficiency at λ, e·λ/(h·c), A/W. */
function responsivityPerQe(lambdaM: number): number {
  return (ELEMENTARY_CHARGE * lambdaM) / (PLANCK * SPEED_OF_LIGHT);
}

interface QeReading {
  qe: Spread;
  source: 'curve' | 'spec' | 'responsivity';
}

function detectorQe(d: PhotodiodeSpec, lambdaNm: number): QeReading | string {
  const curve = d.qeCurve === undefined ? null : readCurve('detector.qeCurve', d.qeCurve, 'wavelengthNm', 'qe', efficiency);
  if (curve !== null) {
    const qe = interpolateCurve('detector.qeCurve', curve, lambdaNm);
    if (qe !== null) return { qe: { nominal: qe, low: qe, high: qe }, source: 'curve' };
  }
  const at = d.wavelengthNm === undefined ? undefined : positive('detector.wavelengthNm', d.wavelengthNm);
  if (at !== undefined && nearWavelength(at, lambdaNm)) {
    if (d.quantumEfficiency !== undefined) {
      const qe = spread('detector.quantumEfficiency', d.quantumEfficiency, 1);
      efficiency('detector.quantumEfficiency.value', qe.nominal);
      return { qe, source: 'spec' };
    }
    if (d.responsivityAW !== undefined) {
      const r = spread('detector.responsivityAW', d.responsivityAW);
      const k = 1 / responsivityPerQe(at * 1e-9);
      const nominal = r.nominal * k;
      if (!(nominal > 0 && nominal <= 1)) {
        throw new FitInputError(
          'detector.responsivityAW.value',
          `${r.nominal} A/W at ${at} nm implies a quantum efficiency of ${fmt(nominal)}, outside (0, 1]`,
        );
      }
      return { qe: { nominal, low: r.low * k, high: Math.min(1, r.high * k) }, source: 'responsivity' };
    }
  }
  const given: string[] = [];
  if (curve !== null && curve.length > 0) {
    const xs = curve.map((p) => p.x);
    given.push(`curve covers ${fmt(Math.min(...xs), 6)}–${fmt(Math.max(...xs), 6)} nm`);
  }
  if (at !== undefined) given.push(`stated at ${formatNm(at)}`);
  return `no quantum efficiency at ${formatNm(lambdaNm)}${given.length > 0 ? ` (${given.join('; ')})` : ''}`;
}

function squeezingSourceOf(goal: SqueezingGoal): { source: SqueezingSource; label: string } {
  const s = requireObject('goal.source', goal.source) as unknown as SqueezingGoal['source'];
  const kind = oneOf('goal.source.kind', s.kind, ['initial', 'opo'] as const);
  if (kind === 'initial') {
    const init = s as Extract<SqueezingGoal['source'], { kind: 'initial' }>;
    const initialDb = positive('goal.source.initialDb', init.initialDb);
    return {
      source:
        init.antiSqueezingDb === undefined
          ? { initialDb }
          : { initialDb, antiSqueezingDb: positive('goal.source.antiSqueezingDb', init.antiSqueezingDb) },
      label: `initial ${fmt(initialDb)} dB`,
    };
  }
  const opo = s as Extract<SqueezingGoal['source'], { kind: 'opo' }>;
  const pumpParameter = nonNegative('goal.source.pumpParameter', opo.pumpParameter);
  const halfWidth = positive('goal.source.linewidthHz', opo.linewidthHz) / 2;
  return {
    source: { pumpParameter, omegaOverGamma: positive('goal.sidebandHz', goal.sidebandHz) / halfWidth },
    label: `OPO x = ${fmt(pumpParameter)}`,
  };
}

function db(v: number): number {
  return -10 * Math.log10(v) + 0;
}

interface Electronics {
  eta: number;
  clearanceDb: number;
}

/** Forms 12.2–12.3 at the LO photocurrent I = η_QE·(eλ/hc)·P_LO: s = 2eI/i_n², η_el = s/(1 + s). */
function electronics(qe: number, perQe: number, loPowerW: number, noise: number): Electronics {
  const s = finiteResult(
    'detector.noiseCurrentAPerRtHz',
    (2 * ELEMENTARY_CHARGE * qe * perQe * loPowerW) / noise / noise,
    'shot-to-dark ratio',
  );
  return { eta: s / (1 + s), clearanceDb: 10 * Math.log10(1 + s) };
}

/**
 * The squeezing goal against one photodiode or balanced detector. QE at the wavelength from the
 * detector's curve, else its spec or responsivity quoted within 1 nm; electronic efficiency from
 * its input-referred noise (or NEP × responsivity) at the LO photocurrent (12.2–12.3); predicted
 * measured squeezing V− = 1 − η·k (sourceSlopes). Worst case: QE at −tol and noise at +tol.
 * Bandwidth below the sideband, saturation below the LO power and no QE at the wavelength are
 * blocking reasons. Without a noise figure the electronics are taken as noiseless and the verdict
 * is at most marginal.
 */
export function evaluateSqueezingGoal(goal: SqueezingGoal, detector: PhotodiodeSpec): SqueezingGoalResult {
  const g = requireObject('goal', goal) as unknown as SqueezingGoal;
  const d = requireObject('detector', detector) as unknown as PhotodiodeSpec;
  const lambdaNm = positive('goal.wavelengthNm', g.wavelengthNm);
  const targetDb = positive('goal.targetDb', g.targetDb);
  const sidebandHz = positive('goal.sidebandHz', g.sidebandHz);
  const escape = efficiency('goal.escapeEfficiency', g.escapeEfficiency);
  const propagation = efficiency('goal.propagationEfficiency', g.propagationEfficiency);
  const visibility = efficiency('goal.visibility', g.visibility);
  const loPowerW = positive('goal.loPowerW', g.loPowerW);
  const theta = g.phaseNoiseRad === undefined ? 0 : finite('goal.phaseNoiseRad', g.phaseNoiseRad);
  const bandwidthHz = positive('detector.bandwidthHz', d.bandwidthHz);
  const saturationW = d.saturationPowerW === undefined ? null : positive('detector.saturationPowerW', d.saturationPowerW);
  if (d.cmrrDb !== undefined) nonNegative('detector.cmrrDb', d.cmrrDb);
  const { source, label } = squeezingSourceOf(g);
  const slopes = sourceSlopes({ source, phaseNoiseRad: theta });
  const k = slopes.squeezed;
  const chain = escape * propagation * visibility * visibility;
  const totalRequired = k > 0 ? finiteResult('goal.source', -Math.expm1((-targetDb / 10) * Math.LN10) / k, 'required efficiency') : 0;

  const blocking: string[] = [];
  const reasons: string[] = [];
  const notes: string[] = [];
  if (bandwidthHz < sidebandHz) {
    blocking.push(`bandwidth ${formatHz(bandwidthHz)} below the ${formatHz(sidebandHz)} sideband`);
  } else if (sidebandHz > bandwidthHz / 2) {
    notes.push(
      `the ${formatHz(sidebandHz)} sideband is within a factor 2 of the ${formatHz(bandwidthHz)} bandwidth: gain and clearance roll off there`,
    );
  }
  if (saturationW !== null && saturationW < loPowerW) {
    blocking.push(`local oscillator ${formatWatts(loPowerW)} above the ${formatWatts(saturationW)} saturation power`);
  }
  if (k <= 0) {
    reasons.push(`the source (${label}) shows no squeezing with a ${fmt(theta)} rad phase offset`);
  } else if (totalRequired > 1) {
    reasons.push(
      `${fmt(targetDb)} dB needs a total efficiency of ${fmt(totalRequired, 4)}, above 1, from this source (${label}) even with a perfect detector`,
    );
  }
  const requiredQEIdealElectronics = k > 0 ? finiteResult('goal', totalRequired / chain, 'required quantum efficiency') : null;
  const qeReading = detectorQe(d, lambdaNm);
  if (typeof qeReading === 'string') {
    return {
      goal: targetDb,
      unit: 'dB',
      formula: FORMULA,
      source: SOURCE,
      requiredQEIdealElectronics,
      pass: false,
      verdict: 'does-not-fit',
      figure: null,
      worst: null,
      headroom: null,
      reasons: [...blocking, qeReading, ...reasons],
      notes,
      requiredQE: null,
      quantumEfficiency: null,
      electronicEfficiency: null,
      clearanceDb: null,
      totalEfficiency: null,
      antiSqueezedDb: null,
      qeSource: null,
    };
  }

  const perQe = responsivityPerQe(lambdaNm * 1e-9);
  const qe = qeReading.qe;
  let noise: Spread | null = null;
  if (d.noiseCurrentAPerRtHz !== undefined) {
    noise = spread('detector.noiseCurrentAPerRtHz', d.noiseCurrentAPerRtHz);
    positive('detector.noiseCurrentAPerRtHz.value', noise.nominal);
  } else if (d.nepWPerRtHz !== undefined) {
    const n = positive('detector.nepWPerRtHz', d.nepWPerRtHz) * qe.nominal * perQe;
    noise = { nominal: n, low: n, high: n };
    notes.push('electronic noise current from the NEP times the responsivity at this wavelength');
  }
  const noiseless: Electronics = { eta: 1, clearanceDb: 0 };
  const elNominal = noise === null ? noiseless : electronics(qe.nominal, perQe, loPowerW, noise.nominal);
  const elWorst = noise === null ? noiseless : electronics(qe.low, perQe, loPowerW, noise.high);
  const etaNominal = chain * qe.nominal * elNominal.eta;
  const etaWorst = chain * qe.low * elWorst.eta;
  const figure = db(1 - etaNominal * k);
  const worst = db(1 - etaWorst * k);
  const antiSqueezedDb = -db(1 + etaNominal * slopes.antiSqueezed);
  const requiredQE =
    k > 0 && elWorst.eta > 0 ? finiteResult('detector', totalRequired / (chain * elWorst.eta), 'required quantum efficiency') : null;
  if (requiredQE !== null && requiredQE > 1 && totalRequired <= 1) {
    reasons.push(
      `needs a quantum efficiency of ${fmt(requiredQE, 4)}, above 1, with this detector's electronic noise: no such detector reaches ${fmt(targetDb)} dB with this budget`,
    );
  }

  let verdict = verdictOf(figure, worst, targetDb, 'higher-db');
  let headroom: number | null = headroomOf(worst, targetDb, 'higher-db');
  if (blocking.length > 0) {
    verdict = 'does-not-fit';
    headroom = null;
  } else if (verdict === 'marginal') {
    reasons.push(
      `worst case ${fmt(worst)} dB (QE at −tol, noise at +tol) misses the ${fmt(targetDb)} dB goal; nominal ${fmt(figure)} dB meets it`,
    );
  } else if (verdict === 'does-not-fit') {
    reasons.push(`predicted ${fmt(figure)} dB misses the ${fmt(targetDb)} dB goal`);
  }
  if (noise === null) {
    reasons.push('no input-referred noise or NEP given: clearance unknown, the figure assumes noiseless electronics');
    verdict = worse(verdict, 'marginal');
  }

  return {
    goal: targetDb,
    unit: 'dB',
    formula: FORMULA,
    source: SOURCE,
    requiredQEIdealElectronics,
    pass: verdict === 'fits',
    verdict,
    figure,
    worst,
    headroom,
    reasons: [...blocking, ...reasons],
    notes,
    requiredQE,
    quantumEfficiency: { nominal: qe.nominal, worst: qe.low },
    electronicEfficiency: { nominal: elNominal.eta, worst: elWorst.eta },
    clearanceDb: noise === null ? null : { nominal: elNominal.clearanceDb, worst: elWorst.clearanceDb },
    totalEfficiency: { nominal: etaNominal, worst: etaWorst },
    antiSqueezedDb,
    qeSource: qeReading.source,
  };
}
