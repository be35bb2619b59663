/**
 * The squeezing goal over photodiodes and balanced detectors (physics.md A5, A12): detectors are
 * ranked by detector-reading.ts (the evaluator's arithmetic on specs read once), the page shows
 * evaluateSqueezingGoal's full result, and the headline is the quantum efficiency the buyer's loss
 * budget asks of any detector (form 12.4).
 * Sources: Collett & Gardiner, Phys. Rev. A 30, 1386 (1984); Appel et al., Phys. Rev. A 75, 035802 (2007).
 */
import {
  evaluateSqueezingGoal,
  FitInputError,
  type GoalResult,
  type PhotodiodeSpec,
  type SqueezingGoal,
  type SqueezingGoalResult,
} from '../../../lib/fit';
import type { Headline, PlotData } from '../../../lib/search/results';
import { THIN } from '../../../lib/units';
import { detectorFigures, detectorKey, squeezingTerms, type SqueezingTerms } from './detector-reading';
import { covers, type Prepared } from './prepare';
import { BLOCKED, unreadable, type RankKey } from './rank';

export type DetectorPrep = Extract<Prepared, { kind: 'photodiode' }>;

/** An ideal detector at the goal's wavelength, evaluated once to check the goal and read its required QE. */
function probeDetector(nm: number): PhotodiodeSpec {
  return { material: 'probe', wavelengthNm: nm, quantumEfficiency: { value: 1 }, bandwidthHz: 1e15 };
}

export interface SqueezingQuery {
  goal: SqueezingGoal;
  probe: SqueezingGoalResult;
  terms: SqueezingTerms;
}

/** Checks the goal once through the evaluator (a FitInputError here is the buyer's input). */
export function squeezingQuery(goal: SqueezingGoal): SqueezingQuery {
  const probe = evaluateSqueezingGoal(goal, probeDetector(goal.wavelengthNm));
  return { goal, probe, terms: squeezingTerms(goal) };
}

export function evaluateSqueezing(q: SqueezingQuery, spec: PhotodiodeSpec): GoalResult {
  try {
    return evaluateSqueezingGoal(q.goal, spec);
  } catch (e) {
    if (!(e instanceof FitInputError)) throw e;
    return unreadable(e, 'dB', q.goal.targetDb, q.probe.formula, q.probe.source);
  }
}

export function squeezingKey(q: SqueezingQuery, p: DetectorPrep): RankKey {
  if (!covers(p.covers, q.goal.wavelengthNm)) return BLOCKED;
  return detectorKey(q.terms, p.read);
}

const LO_POINTS = 21;

/** Predicted measured squeezing against the local-oscillator power (log), the goal dashed, the buyer's power marked. */
export function squeezingPlot(q: SqueezingQuery, p: DetectorPrep): PlotData | null {
  const read = p.read;
  if (read === null || !covers(p.covers, q.goal.wavelengthNm) || detectorFigures(q.terms, read) === null) return null;
  const lo = q.goal.loPowerW / 30;
  const x: number[] = [];
  const nominal: (number | null)[] = [];
  const worst: (number | null)[] = [];
  for (let i = 0; i < LO_POINTS; i++) {
    const w = lo * 900 ** (i / (LO_POINTS - 1));
    const at = detectorFigures({ ...q.terms, loPowerW: w }, read);
    x.push(w);
    nominal.push(at?.figure ?? null);
    worst.push(at?.worst ?? null);
  }
  return {
    title: 'Measured squeezing (dB below shot noise) against local-oscillator power',
    xLabel: 'local-oscillator power (W)',
    yLabel: 'dB',
    logX: true,
    x,
    series: [
      { label: 'nominal', values: nominal },
      { label: 'worst case', values: worst },
      { label: 'goal', values: x.map(() => q.goal.targetDb), dashed: true },
    ],
    markerX: q.goal.loPowerW,
  };
}

export function squeezingHeadline(q: SqueezingQuery): Headline[] {
  const qe = q.probe.requiredQEIdealElectronics;
  return [
    {
      label: 'Quantum efficiency needed (noiseless electronics)',
      value:
        qe === null
          ? 'none: this source shows no squeezing at this phase noise'
          : qe > 1
            ? `${(qe * 100).toPrecision(4)}${THIN}%, above 100 %: no detector reaches the goal`
            : `${(qe * 100).toPrecision(3)}${THIN}% or more`,
    },
    { label: 'Bandwidth at least', value: `the ${(q.goal.sidebandHz / 1e6).toPrecision(3)}${THIN}MHz sideband` },
    { label: 'Saturation power above', value: `${(q.goal.loPowerW * 1e3).toPrecision(3)}${THIN}mW of local oscillator` },
  ];
}
