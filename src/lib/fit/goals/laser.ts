// Laser goal: wavelength coverage, linewidth or coherence length, power (physics.md A8 forms 8.1
// and the hazard-class boundaries).
// Sources: B. E. A. Saleh and M. C. Teich, "Fundamentals of Photonics", ch. 12 (coherence length of
// a Lorentzian line); IEC 60825-1:2014 class boundaries as quoted in secondary summaries.

import { FitInputError } from '../errors';
import { coherenceLength, laserHazardClass } from '../lasers';
import { nonNegative, oneOf, positive, requireObject } from '../validate';
import { fmt, formatHz, formatLength, formatNm, formatSeconds, formatWatts } from './format';
import { spread } from './spec';
import type { Constraint, LaserGoal, LaserGoalResult, LaserSpec } from './types';
import { constraint, limiting, worse } from './verdict';

const FORMULA = 'L_c = c/(π·Δν) (Lorentzian line, 1/e of |g⁽¹⁾|); Δν ≤ goal; P ≥ goal; goal wavelength(s) inside the tuning range';
const SOURCE =
  'Saleh & Teich, Fundamentals of Photonics, ch. 12 (physics.md A8 form 8.1); IEC 60825-1:2014 boundaries (secondary summaries)';

function coverage(laser: LaserSpec, goal: LaserGoal): string | null {
  const centre = positive('laser.centreWavelengthNm', laser.centreWavelengthNm);
  const hasTuning = laser.tuningMinNm !== undefined || laser.tuningMaxNm !== undefined;
  const lo = laser.tuningMinNm === undefined ? centre : positive('laser.tuningMinNm', laser.tuningMinNm);
  const hi = laser.tuningMaxNm === undefined ? centre : positive('laser.tuningMaxNm', laser.tuningMaxNm);
  if (lo > hi) throw new FitInputError('laser.tuningMinNm', 'must not exceed tuningMaxNm');
  const w = requireObject('goal.wavelength', goal.wavelength) as unknown as LaserGoal['wavelength'];
  const kind = oneOf('goal.wavelength.kind', w.kind, ['fixed', 'range'] as const);
  const offered = hasTuning ? `tuning ${fmt(lo, 6)}–${fmt(hi, 6)} nm` : `fixed at ${formatNm(centre)} (no tuning range listed)`;
  if (kind === 'fixed') {
    const f = w as Extract<LaserGoal['wavelength'], { kind: 'fixed' }>;
    const nm = positive('goal.wavelength.nm', f.nm);
    const slack = f.toleranceNm === undefined ? 0 : nonNegative('goal.wavelength.toleranceNm', f.toleranceNm);
    return nm >= lo - slack && nm <= hi + slack ? null : `${offered} does not reach ${formatNm(nm)}`;
  }
  const r = w as Extract<LaserGoal['wavelength'], { kind: 'range' }>;
  const min = positive('goal.wavelength.minNm', r.minNm);
  const max = positive('goal.wavelength.maxNm', r.maxNm);
  if (min > max) throw new FitInputError('goal.wavelength.minNm', 'must not exceed maxNm');
  return min >= lo && max <= hi ? null : `${offered} does not cover ${fmt(min, 6)}–${fmt(max, 6)} nm`;
}

/**
 * The laser goal against one laser listing. Linewidth worst case at +tol, power at −tol; the
 * coherence length follows the Lorentzian form 8.1. The hazard suggestion uses the upper end of the
 * power tolerance.
 */
export function evaluateLaserGoal(goal: LaserGoal, laser: LaserSpec): LaserGoalResult {
  const g = requireObject('goal', goal) as unknown as LaserGoal;
  const l = requireObject('laser', laser) as unknown as LaserSpec;
  const linewidth = spread('laser.linewidthHz', l.linewidthHz);
  positive('laser.linewidthHz.value', linewidth.nominal);
  const power = spread('laser.powerW', l.powerW);
  positive('laser.powerW.value', power.nominal);
  if (l.m2 !== undefined) positive('laser.m2', l.m2);
  const blocking = coverage(l, g);
  const notes: string[] = [];
  const reasons: string[] = blocking === null ? [] : [blocking];
  const constraints: Constraint[] = [];
  const lcNominal = coherenceLength({ linewidthHz: linewidth.nominal });
  const lcWorst = coherenceLength({ linewidthHz: linewidth.high });

  if (g.coherence !== undefined) {
    const c = requireObject('goal.coherence', g.coherence) as unknown as NonNullable<LaserGoal['coherence']>;
    const kind = oneOf('goal.coherence.kind', c.kind, ['linewidth', 'coherence-length'] as const);
    if (kind === 'linewidth') {
      const maxHz = positive('goal.coherence.maxHz', (c as { maxHz: number }).maxHz);
      constraints.push(constraint('linewidth', linewidth.nominal, linewidth.high, maxHz, 'Hz', 'lower', 'Δν (FWHM) ≤ goal'));
    } else {
      const minM = positive('goal.coherence.minM', (c as { minM: number }).minM);
      constraints.push(constraint('coherence length', lcNominal, lcWorst, minM, 'm', 'higher', 'L_c = c/(π·Δν)'));
    }
    if (!l.singleFrequency) {
      notes.push('not single-frequency: the linewidth is the full spectral width and the Lorentzian coherence length is only indicative');
    }
    if (l.linewidthTimeS !== undefined) {
      notes.push(
        `linewidth quoted over ${formatSeconds(positive('laser.linewidthTimeS', l.linewidthTimeS))}; over longer times drift broadens it`,
      );
    }
  }
  if (g.minPowerW !== undefined) {
    const minW = positive('goal.minPowerW', g.minPowerW);
    constraints.push(constraint('power', power.nominal, power.low, minW, 'W', 'higher', 'P ≥ goal'));
  }

  let verdict: LaserGoalResult['verdict'] = blocking === null ? 'fits' : 'does-not-fit';
  for (const c of constraints) {
    verdict = worse(verdict, c.verdict);
    if (c.verdict === 'fits') continue;
    const when = c.verdict === 'marginal' ? 'in the worst case' : '';
    const shown = c.verdict === 'marginal' ? c.worst : c.figure;
    const text =
      c.name === 'linewidth'
        ? `linewidth ${formatHz(shown)} ${when} above the ${formatHz(c.goal)} goal`
        : c.name === 'power'
          ? `power ${formatWatts(shown)} ${when} below the ${formatWatts(c.goal)} goal`
          : `coherence length ${formatLength(shown)} ${when} below the ${formatLength(c.goal)} goal`;
    reasons.push(text.replace(/\s+/g, ' '));
  }
  const hazard = laserHazardClass({ wavelengthM: positive('laser.centreWavelengthNm', l.centreWavelengthNm) * 1e-9, powerW: power.high });
  notes.push(hazard.caution);
  const lim = limiting(constraints);
  return {
    pass: verdict === 'fits',
    verdict,
    figure: lim?.figure ?? null,
    worst: lim?.worst ?? null,
    goal: lim?.goal ?? null,
    headroom: lim === null || blocking !== null ? null : lim.headroom,
    unit: lim?.unit ?? 'nm',
    reasons,
    notes,
    formula: FORMULA,
    source: SOURCE,
    constraints,
    coherenceLengthM: { nominal: lcNominal, worst: lcWorst },
    hazard,
  };
}
