// Photon-counting goal: system detection efficiency against a heralding or Bell-test threshold,
// coincidence-to-accidental ratio from dark counts and the window, dead-time losses at the count
// rate, jitter against the window (physics.md A6 forms 6.1, 6.2, 6.5–6.7, 6.9).
// Sources: A. Garg and N. D. Mermin, Phys. Rev. D 35, 3831 (1987); P. H. Eberhard, Phys. Rev. A 47,
// R747 (1993); D. N. Klyshko, Sov. J. Quantum Electron. 10, 1112 (1980); G. F. Knoll, "Radiation
// Detection and Measurement", 4th ed. (2010), ch. 4.

import { bellThresholds, combinedJitter, windowCapture } from '../counting';
import { FitInputError } from '../errors';
import { interpolateCurve } from '../interpolate';
import { worstCase } from '../tolerances';
import { efficiency, nonNegative, oneOf, positive, powerFraction, requireObject, unitInterval } from '../validate';
import { fmt, formatNm, formatPercent, formatSeconds } from './format';
import { nearWavelength, readCurve, spread, type Spread } from './spec';
import type { Constraint, CountingGoal, CountingGoalResult, SinglePhotonDetectorSpec } from './types';
import { constraint, limiting, worse } from './verdict';

/** Cooling words that mean cryogens or a cryostat (not room temperature or a thermoelectric cooler). */
const CRYOGENIC = /cryo|helium|nitrogen|kelvin|\d\s*K\b/i;

const FORMULA =
  'η_sys = η_det·η_opt·erf(W/(2√2σ)) against the threshold; CAR = C/A with C = R·η_opt·η_det²·capture, A = N²·τ_c, N = η_det·R + D; dead-time loss = r·τ_d/(1 + r·τ_d), r = η_det·R + D (non-paralyzable)';
const SOURCE =
  'Garg & Mermin, PRD 35, 3831 (1987); Eberhard, PRA 47, R747 (1993); Klyshko, Sov. J. Quantum Electron. 10, 1112 (1980); Knoll, Radiation Detection and Measurement 4th ed. (2010) ch. 4 (physics.md A6 forms 6.1, 6.2, 6.5–6.7, 6.9)';

/** Dead-time loss share the goal tolerates when it does not say (a common design margin). */
const DEFAULT_MAX_DEAD_TIME_LOSS = 0.1;

function detectionEfficiency(d: SinglePhotonDetectorSpec, lambdaNm: number): Spread | string {
  if (d.efficiencyCurve !== undefined) {
    const pts = readCurve('detector.efficiencyCurve', d.efficiencyCurve, 'wavelengthNm', 'efficiency', efficiency);
    const e = interpolateCurve('detector.efficiencyCurve', pts, lambdaNm);
    if (e !== null) return { nominal: e, low: e, high: e };
  }
  const at = d.wavelengthNm === undefined ? undefined : positive('detector.wavelengthNm', d.wavelengthNm);
  if (at !== undefined && d.efficiency !== undefined && nearWavelength(at, lambdaNm)) {
    const e = spread('detector.efficiency', d.efficiency, 1);
    efficiency('detector.efficiency.value', e.nominal);
    return e;
  }
  return `no detection efficiency at ${formatNm(lambdaNm)}${at === undefined ? '' : ` (stated at ${formatNm(at)})`}`;
}

/** A spread as a worstCase input: ± the wider side, clamped to the spread's own ends. */
function tol(s: Spread): { value: number; tol: number; min: number; max: number } {
  return { value: s.nominal, tol: Math.max(s.nominal - s.low, s.high - s.nominal), min: s.low, max: s.high };
}

/**
 * The counting goal against one single-photon detector model (both arms use a unit of it). Each
 * constraint is judged on its own worst case (each toleranced input at its pessimistic end for that
 * constraint); the figure is the limiting constraint and every failed one is a reason.
 */
export function evaluateCountingGoal(goal: CountingGoal, detector: SinglePhotonDetectorSpec): CountingGoalResult {
  const g = requireObject('goal', goal) as unknown as CountingGoal;
  const d = requireObject('detector', detector) as unknown as SinglePhotonDetectorSpec;
  const lambdaNm = positive('goal.wavelengthNm', g.wavelengthNm);
  const target = requireObject('goal.target', g.target) as unknown as CountingGoal['target'];
  const kind = oneOf('goal.target.kind', target.kind, ['heralding', 'bell'] as const);
  const opt = efficiency('goal.opticalEfficiency', g.opticalEfficiency);
  const rate = g.countRateHz === undefined ? null : positive('goal.countRateHz', g.countRateHz);
  const windowS = g.coincidenceWindowS === undefined ? null : positive('goal.coincidenceWindowS', g.coincidenceWindowS);
  const carMin = g.carMin === undefined ? null : positive('goal.carMin', g.carMin);
  const maxLoss = g.maxDeadTimeLoss === undefined ? DEFAULT_MAX_DEAD_TIME_LOSS : powerFraction('goal.maxDeadTimeLoss', g.maxDeadTimeLoss);
  if (carMin !== null && (rate === null || windowS === null)) {
    throw new FitInputError('goal.carMin', 'needs countRateHz and coincidenceWindowS');
  }
  const dark = spread('detector.darkCountRateHz', d.darkCountRateHz);
  const jitter = nonNegative('detector.jitterFwhmS', d.jitterFwhmS);
  const deadTimeS = positive('detector.deadTimeS', d.deadTimeS);
  const afterpulsing = d.afterpulsing === undefined ? null : unitInterval('detector.afterpulsing', d.afterpulsing);

  let threshold: number;
  let thresholdName: string;
  if (kind === 'heralding') {
    threshold = efficiency('goal.target.efficiency', (target as { efficiency: number }).efficiency);
    thresholdName = 'heralding efficiency goal';
  } else {
    const test = oneOf('goal.target.test', (target as { test: string }).test, ['chsh', 'eberhard'] as const);
    threshold = bellThresholds()[test];
    thresholdName = test === 'chsh' ? 'CHSH threshold 2/(1 + √2)' : 'Eberhard threshold 2/3';
  }

  const notes: string[] = [];
  const reasons: string[] = [];
  const pairJitter = combinedJitter([jitter, jitter]);
  const capture = windowS === null ? 1 : windowCapture({ windowS, jitterFwhmS: pairJitter });
  if (windowS !== null) {
    notes.push(
      `jitter ${formatSeconds(jitter)} per detector, ${formatSeconds(pairJitter)} FWHM for a pair: ${formatPercent(capture)} of true coincidences fall inside the ${formatSeconds(windowS)} window`,
    );
  }
  if (kind === 'bell') notes.push('the Bell thresholds assume no background; dark counts raise them (Eberhard 1993)');
  if (afterpulsing !== null && afterpulsing > 0) {
    notes.push(`afterpulsing ${formatPercent(afterpulsing)} adds correlated false counts, not included`);
  }
  // room-temperature and thermoelectric cooling carry no cryogenic hazard
  if (typeof d.cooling === 'string' && CRYOGENIC.test(d.cooling)) {
    notes.push(`cooling (${d.cooling}): cryogenics and pressurised helium need local safety rules and trained handling`);
  }

  const eff = detectionEfficiency(d, lambdaNm);
  const capturedShare = windowS === null ? null : capture;
  if (typeof eff === 'string') {
    return {
      goal: threshold,
      formula: FORMULA,
      source: SOURCE,
      windowCapture: capturedShare,
      pass: false,
      verdict: 'does-not-fit',
      figure: null,
      worst: null,
      headroom: null,
      unit: '',
      reasons: [eff],
      notes,
      constraints: [],
      detectionEfficiency: null,
    };
  }

  const constraints: Constraint[] = [];
  const etaInput = tol(eff);
  const sys = worstCase(({ eta }) => eta * opt * capture, { eta: etaInput });
  constraints.push(
    constraint(
      kind === 'heralding' ? 'heralding efficiency' : 'detection efficiency',
      sys.nominal,
      sys.worst,
      threshold,
      '',
      'higher',
      'η_det·η_opt·capture',
    ),
  );

  if (carMin !== null && rate !== null && windowS !== null) {
    const car = worstCase(
      ({ eta, dark: dc }) => {
        const singles = eta * rate + dc;
        return singles === 0 ? 0 : (rate * opt * eta * eta * capture) / (singles * singles * windowS);
      },
      { eta: etaInput, dark: tol(dark) },
    );
    constraints.push(
      constraint(
        'coincidence-to-accidental ratio',
        car.nominal,
        car.worst,
        carMin,
        '',
        'higher',
        '(C − A)/A = R·η_opt·η_det²·capture/(N²·τ_c)',
      ),
    );
  }
  if (rate !== null) {
    const loss = worstCase(
      ({ eta, dark: dc }) => {
        const x = (eta * rate + dc) * deadTimeS;
        return x / (1 + x);
      },
      { eta: etaInput, dark: tol(dark) },
      { better: 'lower' },
    );
    constraints.push(constraint('dead-time loss', loss.nominal, loss.worst, maxLoss, '', 'lower', 'r·τ_d/(1 + r·τ_d)'));
  }

  let verdict: CountingGoalResult['verdict'] = 'fits';
  for (const c of constraints) {
    verdict = worse(verdict, c.verdict);
    if (c.verdict === 'fits') continue;
    const when = c.verdict === 'marginal' ? 'in the worst case' : 'at nominal';
    if (c.name === 'dead-time loss') {
      reasons.push(
        `dead time ${formatSeconds(deadTimeS)} limits the rate: ${fmt(rate ?? 0)} photons/s loses ${formatPercent(c.verdict === 'marginal' ? c.worst : c.figure)} ${when} (limit ${formatPercent(c.goal)})`,
      );
    } else if (c.name === 'coincidence-to-accidental ratio') {
      reasons.push(
        `CAR ${fmt(c.verdict === 'marginal' ? c.worst : c.figure)} ${when} (dark counts ${fmt(dark.nominal)}/s, window ${formatSeconds(windowS ?? 0)}) below the goal ${fmt(c.goal)}`,
      );
    } else {
      reasons.push(
        `${c.name} ${fmt(c.verdict === 'marginal' ? c.worst : c.figure, 4)} ${when} below the ${thresholdName} ${fmt(c.goal, 4)}`,
      );
    }
  }
  const lim = limiting(constraints) as Constraint;
  return {
    formula: FORMULA,
    source: SOURCE,
    windowCapture: capturedShare,
    pass: verdict === 'fits',
    verdict,
    figure: lim.figure,
    worst: lim.worst,
    goal: lim.goal,
    headroom: lim.headroom,
    unit: lim.unit,
    reasons,
    notes,
    constraints,
    detectionEfficiency: { nominal: eff.nominal, worst: eff.low },
  };
}
