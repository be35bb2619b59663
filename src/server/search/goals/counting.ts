/**
 * The photon-counting goal over single-photon detectors (physics.md A6): each detector that may have
 * a detection efficiency at the buyer's wavelength is evaluated by evaluateCountingGoal; the figure is
 * the limiting constraint. The headline is the detection efficiency the threshold asks for with the
 * buyer's optical efficiency. Sources: Garg & Mermin, Phys. Rev. D 35, 3831 (1987); Eberhard, Phys.
 * Rev. A 47, R747 (1993).
 */
import {
  bellThresholds,
  evaluateCountingGoal,
  FitInputError,
  type CountingGoal,
  type CountingGoalResult,
  type GoalResult,
  type SinglePhotonDetectorSpec,
} from '../../../lib/fit';
import { limiting } from '../../../lib/fit/goals/verdict';
import type { Headline, PlotData } from '../../../lib/search/results';
import { THIN } from '../../../lib/units';
import { covers, type Prepared } from './prepare';
import { BLOCKED, keyOf, unreadable, type RankKey } from './rank';

export type CounterPrep = Extract<Prepared, { kind: 'counter' }>;

export interface CountingQuery {
  goal: CountingGoal;
  threshold: number;
  probe: CountingGoalResult;
}

/** An ideal detector at the goal's wavelength, evaluated once to check the goal. */
function probeDetector(nm: number): SinglePhotonDetectorSpec {
  return {
    technology: 'probe',
    wavelengthNm: nm,
    efficiency: { value: 1 },
    darkCountRateHz: { value: 0 },
    jitterFwhmS: 0,
    deadTimeS: 1e-12,
  };
}

export function countingQuery(goal: CountingGoal): CountingQuery {
  const probe = evaluateCountingGoal(goal, probeDetector(goal.wavelengthNm));
  const threshold = goal.target.kind === 'heralding' ? goal.target.efficiency : bellThresholds()[goal.target.test];
  return { goal, threshold, probe };
}

export function evaluateCounting(q: CountingQuery, spec: SinglePhotonDetectorSpec): GoalResult {
  try {
    return evaluateCountingGoal(q.goal, spec);
  } catch (e) {
    if (!(e instanceof FitInputError)) throw e;
    return unreadable(e, '', q.threshold, q.probe.formula, q.probe.source);
  }
}

export function countingKey(q: CountingQuery, p: CounterPrep): RankKey {
  if (!covers(p.covers, q.goal.wavelengthNm)) return BLOCKED;
  return keyOf(evaluateCounting(q, p.spec));
}

export function countingFigureLabel(r: GoalResult): string {
  const lim = 'constraints' in r ? limiting((r as CountingGoalResult).constraints) : null;
  return lim === null ? 'Limiting figure' : `Limiting figure: ${lim.name}`;
}

/** The measured efficiency curve times the buyer's optical efficiency across the curve, the threshold dashed. */
export function countingPlot(q: CountingQuery, p: CounterPrep): PlotData | null {
  const curve = p.spec.efficiencyCurve;
  if (!curve || curve.length < 2) return null;
  const points = [...curve].sort((a, b) => a.wavelengthNm - b.wavelengthNm);
  const x = points.map((c) => c.wavelengthNm);
  return {
    title: 'Detection efficiency × your optical efficiency',
    xLabel: 'wavelength (nm)',
    yLabel: 'efficiency',
    x,
    series: [
      { label: 'η_det·η_opt', values: points.map((c) => c.efficiency * q.goal.opticalEfficiency) },
      { label: 'threshold', values: x.map(() => q.threshold), dashed: true },
    ],
    markerX: q.goal.wavelengthNm,
  };
}

export function countingHeadline(q: CountingQuery): Headline[] {
  const need = q.threshold / q.goal.opticalEfficiency;
  return [
    {
      label: 'Detection efficiency needed',
      value:
        need > 1
          ? `${(need * 100).toPrecision(3)}${THIN}%: above 100 %, your optics alone miss the threshold`
          : `${(need * 100).toPrecision(3)}${THIN}% or more at ${q.goal.wavelengthNm}${THIN}nm`,
    },
  ];
}
