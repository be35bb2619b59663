// Squeezing goal: predicted measured squeezing with a candidate photodiode or balanced detector,
// and the quantum efficiency the buyer's budget demands (physics.md A5 forms 5.1, 5.5–5.7; A12
// forms 12.1–12.6).
// Sources: M. J. Collett and C. W. Gardiner, Phys. Rev. A 30, 1386 (1984); E. S. Polzik et al.,
// Appl. Phys. B 55, 279 (1992); J. Appel et al., "Electronic noise in optical homodyne tomography",
// Phys. Rev. A 75, 035802 (2007); CODATA 2018 exact constants.

import { ELEMENTARY_CHARGE, PLANCK, SPEED_OF_LIGHT } from '../constants';
import { FitInputError } from '../errors';
import { interpolateCurve } from '../interpolate';
import { squeezingSlope, type SqueezingSource } from '../squeezing';
import { efficiency, finite, nonNegative, oneOf, positive, requireObject } from '../validate';
import { fmt, formatHz, formatNm, formatWatts } from './format';
import { nearWavelength, spread, type Spread } from './spec';
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
  if (d.qeCurve !== undefined) {
    const pts = d.qeCurve.map((p, i) => ({
      x: positive(`detector.qeCurve[${i}].wavelengthNm`, p.wavelengthNm),
      y: efficiency(`detector.qeCurve[${i}].qe`, p.qe),
    }));
    const qe = interpolateCurve('detector.qeCurve', pts, lambdaNm);
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
  if (d.qeCurve !== undefined && d.qeCurve.length > 0) {
    const xs = d.qeCurve.map((p) => p.wavelengthNm);
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
    return {
      source:
        init.antiSqueezingDb === undefined
          ? { initialDb: init.initialDb }
          : { initialDb: init.initialDb, antiSqueezingDb: init.antiSqueezingDb },
      label: `initial ${fmt(init.initialDb)} dB`,
    };
  }
  const opo = s as Extract<SqueezingGoal['source'], { kind: 'opo' }>;
  const halfWidth = positive('goal.source.linewidthHz', opo.linewidthHz) / 2;
  return {
    source: { pumpParameter: opo.pumpParameter, omegaOverGamma: positive('goal.sidebandHz', goal.sidebandHz) / halfWidth },
    label: `OPO x = ${fmt(opo.pumpParameter)}`,
  };
}

function db(v: number): number {
  return -10 * Math.log10(v) + 0;
}

/**
 * The squeezing goal against one photodiode or balanced detector. QE at the wavelength from the
 * detector's curve, else its spec or responsivity quoted within 1 nm; electronic efficiency from
 * its input-referred noise (or NEP × responsivity) at the LO photocurrent (12.2–12.3); predicted
 * measured squeezing V_meas = 1 − η·k (squeezingSlope). Worst case: QE at −tol and noise at +tol.
 * Bandwidth below the sideband and saturation below the LO power are blocking reasons. Without a
 * noise figure the electronics are taken as noiseless and the verdict is at most marginal.
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
  const { source, label } = squeezingSourceOf(g);
  const k = squeezingSlope({ source, phaseNoiseRad: theta });
  const chain = escape * propagation * visibility * visibility;
  const vTarget = Math.pow(10, -targetDb / 10);
  const totalRequired = (1 - vTarget) / k;

  const reasons: string[] = [];
  const notes: string[] = [];
  let cap: SqueezingGoalResult['verdict'] = 'fits';
  if (bandwidthHz < sidebandHz) {
    reasons.push(`bandwidth ${formatHz(bandwidthHz)} below the ${formatHz(sidebandHz)} sideband`);
  } else if (sidebandHz > bandwidthHz / 2) {
    notes.push(`the ${formatHz(sidebandHz)} sideband is within a factor 2 of the ${formatHz(bandwidthHz)} bandwidth: gain and clearance roll off there`);
  }
  if (d.saturationPowerW !== undefined && positive('detector.saturationPowerW', d.saturationPowerW) < loPowerW) {
    reasons.push(`local oscillator ${formatWatts(loPowerW)} above the ${formatWatts(d.saturationPowerW)} saturation power`);
  }
  if (k <= 0) reasons.push(`the source (${label}) shows no squeezing with a ${fmt(theta)} rad phase offset`);
  else if (totalRequired > 1) {
    reasons.push(`${fmt(targetDb)} dB needs a total efficiency of ${fmt(totalRequired, 4)}, above 1, from this source (${label}) even with a perfect detector`);
  }

  const requiredQEIdealElectronics = k > 0 ? totalRequired / chain : null;
  const qeReading = detectorQe(d, lambdaNm);
  const base = {
    goal: targetDb,
    unit: 'dB',
    formula: FORMULA,
    source: SOURCE,
    requiredQEIdealElectronics,
  };
  if (typeof qeReading === 'string') {
    reasons.push(qeReading);
    return {
      ...base,
      pass: false,
      verdict: 'does-not-fit',
      figure: null,
      worst: null,
      headroom: null,
      reasons,
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
  let noise: Spread | null = null;
  if (d.noiseCurrentAPerRtHz !== undefined) {
    noise = spread('detector.noiseCurrentAPerRtHz', d.noiseCurrentAPerRtHz);
    positive('detector.noiseCurrentAPerRtHz.value', noise.nominal);
  } else if (d.nepWPerRtHz !== undefined) {
    const nep = positive('detector.nepWPerRtHz', d.nepWPerRtHz);
    const n = nep * qeReading.qe.nominal * perQe;
    noise = { nominal: n, low: n, high: n };
    notes.push('electronic noise from the NEP times the responsivity at this wavelength');
  } else {
    cap = 'marginal';
    reasons.push('no input-referred noise or NEP given: clearance unknown, the figure assumes noiseless electronics');
  }
  const electronic = (qe: number, n: number | null): { eta: number; clearanceDb: number } => {
    if (n === null) return { eta: 1, clearanceDb: Infinity };
    if (n === 0 || qe === 0) return { eta: n === 0 ? 1 : 0, clearanceDb: n === 0 ? Infinity : 0 };
    const s = ((2 * ELEMENTARY_CHARGE * qe * perQe * loPowerW) / n) / n;
    return { eta: s / (1 + s), clearanceDb: 10 * Math.log10(1 + s) };
  };
  const qe = qeReading.qe;
  const elNominal = electronic(qe.nominal, noise?.nominal ?? null);
  const elWorst = electronic(qe.low, noise?.high ?? null);
  const etaNominal = chain * qe.nominal * elNominal.eta;
  const etaWorst = chain * qe.low * elWorst.eta;
  const figure = db(1 - etaNominal * k);
  const worstDb = db(1 - etaWorst * k);
  const antiSqueezedDb = -db(1 - etaNominal * (1 - rotateAnti(source, theta)));
  const requiredQE = k > 0 ? totalRequired / (chain * elWorst.eta) : null;
  if (requiredQE !== null && requiredQE > 1 && totalRequired <= 1) {
    reasons.push(`needs a quantum efficiency of ${fmt(requiredQE, 4)}, above 1, with this detector's electronics: no detector of this noise reaches ${fmt(targetDb)} dB with this budget`);
  }

  let verdict = verdictOf(figure, worstDb, targetDb, 'higher-db');
  let headroom: number | null = headroomOf(worstDb, targetDb, 'higher-db');
  const blocking = reasons.length > (cap === 'marginal' ? 1 : 0);
  if (blocking) {
    verdict = 'does-not-fit';
    headroom = null;
  } else {
    if (verdict === 'marginal') {
      reasons.push(`worst case ${fmt(worstDb)} dB (QE at −tol, noise at +tol) misses the ${fmt(targetDb)} dB goal; nominal ${fmt(figure)} dB meets it`);
    } else if (verdict === 'does-not-fit') {
      reasons.push(`predicted ${fmt(figure)} dB misses the ${fmt(targetDb)} dB goal`);
    }
    verdict = worse(verdict, cap);
  }
  if (d.cmrrDb !== undefined) nonNegative('detector.cmrrDb', d.cmrrDb);

  return {
    ...base,
    pass: verdict === 'fits',
    verdict,
    figure,
    worst: worstDb,
    headroom,
    reasons,
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
