/**
 * The laser goal over laser listings (physics.md A8): every laser is evaluated by evaluateLaserGoal
 * (wavelength inside the tuning range, linewidth or coherence length, power). Source: Saleh & Teich,
 * "Fundamentals of Photonics", ch. 12 (coherence length of a Lorentzian line).
 */
import { evaluateLaserGoal, FitInputError, type GoalResult, type LaserGoal, type LaserGoalResult, type LaserSpec } from '../../../lib/fit';
import { limiting } from '../../../lib/fit/goals/verdict';
import type { Headline, PlotData } from '../../../lib/search/results';
import { formatSI } from '../../../lib/units';
import type { Prepared } from './prepare';
import { keyOf, unreadable, type RankKey } from './rank';

export type LaserPrep = Extract<Prepared, { kind: 'laser' }>;

export interface LaserQuery {
  goal: LaserGoal;
  probe: LaserGoalResult;
}

function probeLaser(goal: LaserGoal): LaserSpec {
  const nm = goal.wavelength.kind === 'fixed' ? goal.wavelength.nm : goal.wavelength.minNm;
  return {
    type: 'probe',
    centreWavelengthNm: nm,
    linewidthHz: { value: 1 },
    powerW: { value: 1 },
    singleFrequency: true,
    fibreOutput: false,
  };
}

export function laserQuery(goal: LaserGoal): LaserQuery {
  return { goal, probe: evaluateLaserGoal(goal, probeLaser(goal)) };
}

export function evaluateLaser(q: LaserQuery, spec: LaserSpec): GoalResult {
  try {
    return evaluateLaserGoal(q.goal, spec);
  } catch (e) {
    if (!(e instanceof FitInputError)) throw e;
    return unreadable(e, 'nm', null, q.probe.formula, q.probe.source);
  }
}

export function laserKey(q: LaserQuery, p: LaserPrep): RankKey {
  return keyOf(evaluateLaser(q, p.spec));
}

export function laserFigureLabel(r: GoalResult): string {
  const lim = 'constraints' in r ? limiting((r as LaserGoalResult).constraints) : null;
  return lim === null ? 'Wavelength coverage' : `Limiting figure: ${lim.name}`;
}

/** The laser's power over its tuning range against the wavelengths and power asked for. */
export function laserPlot(q: LaserQuery, p: LaserPrep): PlotData {
  const s = p.spec;
  const tLo = s.tuningMinNm ?? s.centreWavelengthNm;
  const tHi = s.tuningMaxNm ?? s.centreWavelengthNm;
  const w = q.goal.wavelength;
  const gLo = w.kind === 'fixed' ? w.nm - (w.toleranceNm ?? 0) : w.minNm;
  const gHi = w.kind === 'fixed' ? w.nm + (w.toleranceNm ?? 0) : w.maxNm;
  const lo = Math.min(tLo, gLo);
  const hi = Math.max(tHi, gHi);
  const pad = Math.max(0.5, 0.1 * (hi - lo));
  const grid = Array.from({ length: 41 }, (_, i) => lo - pad + ((hi - lo + 2 * pad) * i) / 40);
  const x = [...new Set([...grid, tLo, tHi, gLo, gHi])].sort((a, b) => a - b);
  const power = s.powerW.value * 1e3;
  const asked = (q.goal.minPowerW ?? s.powerW.value) * 1e3;
  const askedSeries =
    gHi > gLo ? [{ label: 'asked for', values: x.map((nm) => (nm >= gLo && nm <= gHi ? asked : null)), dashed: true }] : [];
  return {
    title: 'Tuning range against the wavelengths you need',
    xLabel: 'wavelength (nm)',
    yLabel: 'power (mW)',
    x,
    series: [{ label: 'this laser', values: x.map((nm) => (nm >= tLo && nm <= tHi ? power : null)) }, ...askedSeries],
    ...(w.kind === 'fixed' ? { markerX: w.nm } : {}),
  };
}

export function laserHeadline(q: LaserQuery): Headline[] {
  const w = q.goal.wavelength;
  const out: Headline[] = [
    {
      label: 'Wavelength',
      value:
        w.kind === 'fixed'
          ? `${w.nm} nm${w.toleranceNm ? ` ± ${w.toleranceNm} nm` : ''} inside the tuning range`
          : `all of ${w.minNm}–${w.maxNm} nm inside the tuning range`,
    },
  ];
  const c = q.goal.coherence;
  if (c)
    out.push(
      c.kind === 'linewidth'
        ? { label: 'Linewidth at most', value: formatSI(c.maxHz, 'Hz') }
        : { label: 'Coherence length at least', value: formatSI(c.minM, 'm') },
    );
  if (q.goal.minPowerW !== undefined) out.push({ label: 'Power at least', value: formatSI(q.goal.minPowerW, 'W') });
  return out;
}
