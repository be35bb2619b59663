/**
 * The fit report's supporting figures in words, per mode, from the evaluator's full result: what a
 * buyer checks after the headline figure (linewidth, g-parameters, waist, cooperativity; QE, clearance
 * and total efficiency; each counting or laser constraint).
 */
import type { CavityGoalResult, Constraint, CountingGoalResult, GoalResult, LaserGoalResult, SqueezingGoalResult } from '../../../lib/fit';
import { formatFigure } from '../../../lib/search/format';
import type { Detail } from '../../../lib/search/results';
import { formatCount, formatDb, formatSI } from '../../../lib/units';

const pct = (x: number) => `${(x * 100).toPrecision(3)}\u2009%`;
const pair = (f: (x: number) => string, n: number, w: number) => (n === w ? f(n) : `${f(n)} (worst ${f(w)})`);

export function cavityDetails(r: GoalResult): Detail[] {
  const c = r as CavityGoalResult;
  const out: Detail[] = [{ label: 'Free spectral range', value: formatSI(c.fsrHz, 'Hz') }];
  if (c.finesse && c.target !== 'finesse') out.push({ label: 'Finesse', value: pair(formatCount, c.finesse.nominal, c.finesse.worst) });
  if (c.linewidthHz && c.target !== 'linewidth')
    out.push({ label: 'Linewidth (FWHM)', value: pair((x) => formatSI(x, 'Hz'), c.linewidthHz.nominal, c.linewidthHz.worst) });
  if (c.storageTimeS && c.target !== 'storage-time')
    out.push({ label: 'Storage time', value: pair((x) => formatSI(x, 's'), c.storageTimeS.nominal, c.storageTimeS.worst) });
  if (c.g1g2 !== null) out.push({ label: 'g1·g2', value: `${c.g1g2.toFixed(3)}${c.stable ? '' : ' (not stable)'}` });
  if (c.waistM !== null) out.push({ label: 'Mode waist (1/e² radius)', value: formatSI(c.waistM, 'm') });
  const sources = c.mirrors.map((m) => m?.source).filter((s): s is NonNullable<typeof s> => s !== undefined);
  if (sources.length)
    out.push({
      label: 'Mirror values from',
      value: [
        ...new Set(
          sources.map((s) =>
            s === 'own' ? 'your mirror' : s === 'spec' ? 'the specs' : s === 'spectrum' ? 'the measured spectrum' : 'the ring-down',
          ),
        ),
      ].join(', '),
    });
  if (c.cooperativity)
    out.push({
      label: 'Cooperativity C1 = g0²/(2κγ)',
      value: `${formatCount(c.cooperativity.c1)}${c.cooperativity.strongCoupling ? ', strong coupling' : ''}`,
    });
  return out;
}

export function squeezingDetails(r: GoalResult): Detail[] {
  const s = r as SqueezingGoalResult;
  const out: Detail[] = [];
  if (s.quantumEfficiency)
    out.push({
      label: `Quantum efficiency (${s.qeSource === 'curve' ? 'measured curve' : s.qeSource === 'responsivity' ? 'from responsivity' : 'spec'})`,
      value: pair(pct, s.quantumEfficiency.nominal, s.quantumEfficiency.worst),
    });
  if (s.clearanceDb)
    out.push({ label: 'Dark-noise clearance', value: pair((x) => formatDb(x, 1), s.clearanceDb.nominal, s.clearanceDb.worst) });
  if (s.totalEfficiency) out.push({ label: 'Total efficiency', value: pair(pct, s.totalEfficiency.nominal, s.totalEfficiency.worst) });
  if (s.requiredQE !== null) out.push({ label: 'QE this detector would need', value: pct(s.requiredQE) });
  if (s.antiSqueezedDb !== null) out.push({ label: 'Anti-squeezing', value: formatDb(s.antiSqueezedDb, 1) });
  return out;
}

function constraintDetails(cs: readonly Constraint[]): Detail[] {
  return cs.map((c) => ({
    label: c.name,
    value: `${pair((x) => formatFigure(x, c.unit), c.figure, c.worst)}; goal ${c.better === 'lower' ? 'at most' : 'at least'} ${formatFigure(c.goal, c.unit)}`,
  }));
}

export function countingDetails(r: GoalResult): Detail[] {
  return constraintDetails((r as CountingGoalResult).constraints ?? []);
}

export function laserDetails(r: GoalResult): Detail[] {
  const l = r as LaserGoalResult;
  if (!l.constraints) return [];
  return [
    ...constraintDetails(l.constraints),
    { label: 'Coherence length', value: pair((x) => formatSI(x, 'm'), l.coherenceLengthM.nominal, l.coherenceLengthM.worst) },
    { label: 'Laser hazard class (suggested)', value: l.hazard.atMostClass ? `at most ${l.hazard.atMostClass}` : l.hazard.hazardClass },
  ];
}
