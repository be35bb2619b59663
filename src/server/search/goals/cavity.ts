/**
 * The cavity goal over mirror listings: the API's goal shape turned into the fit engine's, a rank key
 * per listing computed from the same engine functions evaluateCavityGoal uses (form 1.3 for the
 * finesse, Kogelnik & Li g-parameters for stability, the product's verdict and headroom), the full
 * evaluation for the listings a page shows, best pairs of two listings through bestPairs, and a plot
 * of the finesse across the coating band.
 * Sources: E. Hecht, "Optics", 5th ed. (2017) §9.6 (form 1.3, ℱ = π·ρ^¼/(1 − √ρ), ρ = R1·R2·(1 − L_rt));
 * H. Kogelnik and T. Li, Appl. Opt. 5, 1550 (1966) (stability 0 < g1·g2 < 1) — physics.md A1, A2.
 */
import {
  bestPairs,
  cavityLinewidth,
  evaluateCavityGoal,
  FitInputError,
  gaussianMode,
  requiredReflectivity,
  storageTime,
  type CavityGoal,
  type CavityGoalResult,
  type CavityTarget,
  type GoalResult,
  type MirrorAtWavelength,
  type MirrorSpec,
} from '../../../lib/fit';
import { finesseOf, modeRadius, parseCavityGoal } from '../../../lib/fit/goals/cavity';
import { headroomOf, verdictOf, type Better } from '../../../lib/fit/goals/verdict';
import type { CavitySearchGoal } from '../../../lib/schemas/search';
import type { Headline, PlotData } from '../../../lib/search/results';
import { formatCount, formatSI, THIN } from '../../../lib/units';
import { mirrorAt, type Prepared, type Span } from './prepare';
import { BLOCKED, unreadable, VERDICT_RANK, type RankKey } from './rank';

export type MirrorPrep = Extract<Prepared, { kind: 'mirror' }>;

const PPM = 1e-6;
const BETTER: Record<CavityTarget['kind'], Better> = { finesse: 'higher', linewidth: 'lower', 'storage-time': 'higher' };
const UNIT: Record<CavityTarget['kind'], string> = { finesse: '', linewidth: 'Hz', 'storage-time': 's' };
const LABEL: Record<CavityTarget['kind'], string> = {
  finesse: 'Predicted finesse',
  linewidth: 'Predicted linewidth',
  'storage-time': 'Predicted storage time',
};

/** The API's cavity goal (mm, one target field, own mirror as R or T + loss) as the fit engine's CavityGoal. */
export function toCavityGoal(g: CavitySearchGoal): CavityGoal {
  const target: CavityTarget =
    g.finesse !== undefined
      ? { kind: 'finesse', value: g.finesse }
      : g.linewidthHz !== undefined
        ? { kind: 'linewidth', hz: g.linewidthHz }
        : { kind: 'storage-time', s: g.storageTimeS as number };
  const own = g.configuration === 'with-own-mirror' ? g.ownMirror : undefined;
  return {
    wavelengthNm: g.wavelengthNm,
    lengthM: g.lengthMm / 1000,
    target,
    configuration: g.configuration,
    ...(own === undefined
      ? {}
      : {
          ownMirror:
            own.reflectivity !== undefined
              ? { reflectivity: own.reflectivity, rocMm: own.rocMm }
              : { transmissionPpm: own.transmissionPpm ?? 0, lossPpm: own.lossPpm ?? 0, rocMm: own.rocMm },
        }),
    ...(g.extraLossPpm === undefined ? {} : { extraLossPpm: g.extraLossPpm }),
    ...(g.atom === undefined ? {} : { atom: g.atom }),
  };
}

/** A flat in-band mirror used once per search to read the goal-only values the engine derives (the buyer's own mirror). */
function probeMirror(nm: number): MirrorSpec {
  return {
    diameterMm: 25.4,
    substrate: 'probe',
    rocMm: null,
    designWavelengthNm: nm,
    bandMinNm: nm,
    bandMaxNm: nm,
    transmissionPpm: { value: 100 },
    lossPpm: { value: 0 },
    aoiDeg: 0,
  };
}

export interface CavityQuery {
  goal: CavityGoal;
  lambdaNm: number;
  lengthM: number;
  extraLoss: number;
  kind: CavityTarget['kind'];
  goalFigure: number;
  goalFinesse: number;
  fsrHz: number;
  /** with-own-mirror: the buyer's mirror as the engine reads it (mirror 1). */
  own: MirrorAtWavelength | null;
  stable(roc1M: number | null, roc2M: number | null): boolean;
}

/** Parses and checks the goal once (a FitInputError here is the buyer's input, answered 422). */
export function cavityQuery(goal: CavityGoal): CavityQuery {
  const p = parseCavityGoal(goal);
  const own = goal.configuration === 'with-own-mirror' ? evaluateCavityGoal(goal, probeMirror(p.lambdaNm)).mirrors[0] : null;
  const kind = p.target.kind;
  const goalFigure =
    kind === 'finesse' ? p.goalFinesse : kind === 'linewidth' ? (p.target as { hz: number }).hz : (p.target as { s: number }).s;
  // radii are few; NaN stands for a flat mirror (Map keys compare NaN equal)
  const memo = new Map<number, Map<number, boolean>>();
  return {
    goal,
    lambdaNm: p.lambdaNm,
    lengthM: p.lengthM,
    extraLoss: p.extraLoss,
    kind,
    goalFigure,
    goalFinesse: p.goalFinesse,
    fsrHz: p.fsrHz,
    own,
    stable(roc1M, roc2M) {
      const k1 = roc1M ?? NaN;
      const k2 = roc2M ?? NaN;
      let inner = memo.get(k1);
      if (inner === undefined) memo.set(k1, (inner = new Map()));
      let s = inner.get(k2);
      if (s === undefined) {
        s = gaussianMode({ lengthM: p.lengthM, roc1M: modeRadius(roc1M), roc2M: modeRadius(roc2M), wavelengthM: p.lambdaNm * 1e-9 }).stable;
        inner.set(k2, s);
      }
      return s;
    },
  };
}

function figureOf(q: CavityQuery, f: number): number {
  if (q.kind === 'finesse') return f;
  if (q.kind === 'linewidth') return cavityLinewidth({ lengthM: q.lengthM, finesse: f });
  return storageTime({ lengthM: q.lengthM, finesse: f });
}

/** Verdict and headroom of mirror 1 and mirror 2 at the goal, equal to evaluateCavityGoal's. */
export function pairKey(q: CavityQuery, m1: MirrorAtWavelength, m2: MirrorAtWavelength): RankKey {
  try {
    const nominal = finesseOf(m1.totalPpm, m2.totalPpm, q.extraLoss);
    if (nominal === null) return BLOCKED;
    const worstF = finesseOf(m1.totalWorstPpm, m2.totalWorstPpm, q.extraLoss) ?? nominal;
    if (!q.stable(m1.rocM, m2.rocM)) return BLOCKED;
    const better = BETTER[q.kind];
    const figure = figureOf(q, nominal);
    const worst = figureOf(q, worstF);
    return { rank: VERDICT_RANK[verdictOf(figure, worst, q.goalFigure, better)], headroom: headroomOf(worst, q.goalFigure, better) };
  } catch (e) {
    if (e instanceof FitInputError) return BLOCKED;
    throw e;
  }
}

/** pair: two units of the listing; with-own-mirror: the buyer's mirror and one unit. */
export function cavityKey(q: CavityQuery, p: MirrorPrep): RankKey {
  const m = mirrorAt(p, q.lambdaNm);
  if (m === null) return BLOCKED;
  return pairKey(q, q.own ?? m, m);
}

export function evaluateCavity(q: CavityQuery, a: MirrorSpec, b?: MirrorSpec): GoalResult {
  try {
    return evaluateCavityGoal(q.goal, a, b);
  } catch (e) {
    if (!(e instanceof FitInputError)) throw e;
    const probe = evaluateCavityGoal(
      q.goal,
      probeMirror(q.lambdaNm),
      q.goal.configuration === 'two-listings' ? probeMirror(q.lambdaNm) : undefined,
    );
    return unreadable(e, UNIT[q.kind], q.goalFigure, probe.formula, probe.source);
  }
}

export function cavityFigureLabel(q: CavityQuery): string {
  return LABEL[q.kind];
}

export interface PairFound {
  a: number;
  b: number;
  result: CavityGoalResult;
}

/** A mirror listing with its values at the goal's wavelength. */
export interface MirrorCandidate {
  prep: MirrorPrep;
  reading: MirrorAtWavelength;
}

/**
 * The k best pairs of two different listings (indices into `mirrors`) by worst-case finesse among
 * stable resonators, through bestPairs. Mirrors are taken best loss budget first, M at a time: a pair
 * with a mirror beyond the first M cannot beat the best mirror paired with the M-th, so once the k-th
 * pair found reaches that bound the answer is the same as over all mirrors. A listing whose specs the
 * engine refuses is left out.
 */
export function bestTwoListingPairs(q: CavityQuery, mirrors: readonly MirrorCandidate[], k: number): PairFound[] {
  const order = mirrors.map((m, index) => ({ index, worst: m.reading.totalWorstPpm }));
  order.sort((x, y) => x.worst - y.worst || x.index - y.index);
  let take = Math.min(order.length, 2 * k + 32);
  for (;;) {
    const chosen = order.slice(0, take);
    const found = pairsAmong(
      q,
      chosen.map((u) => mirrors[u.index]!.prep),
      k,
    ).map((f) => ({ ...f, a: chosen[f.a]!.index, b: chosen[f.b]!.index }));
    if (take >= order.length) return found;
    const bound = finesseOf(order[0]!.worst, order[take]!.worst, q.extraLoss) ?? Infinity;
    const last = found[k - 1]?.result.finesse?.worst;
    if (found.length === k && last !== undefined && last >= bound) return found;
    take = Math.min(order.length, take * 2);
  }
}

function pairsAmong(q: CavityQuery, mirrors: MirrorPrep[], k: number): PairFound[] {
  const specs = mirrors.map((m) => m.spec);
  const keep = specs.map((_, i) => i);
  for (;;) {
    try {
      return bestPairs(
        q.goal,
        keep.map((i) => specs[i] as MirrorSpec),
        k,
      ).map((p) => ({ a: keep[p.a]!, b: keep[p.b]!, result: p.result }));
    } catch (e) {
      const bad = e instanceof FitInputError ? /^mirrors\[(\d+)\]/.exec(e.field) : null;
      if (!bad) throw e;
      keep.splice(Number(bad[1]), 1);
    }
  }
}

function spanOf(spans: readonly Span[], nm: number): [number, number] {
  let lo = nm;
  let hi = nm;
  for (const [a, b] of spans) {
    lo = Math.min(lo, a);
    hi = Math.max(hi, b);
  }
  return [lo, hi];
}

const PLOT_POINTS = 41;

/** Finesse (nominal and worst case) across the mirrors' coating bands and measured spectra, the goal dashed, the buyer's wavelength marked. */
export function cavityPlot(q: CavityQuery, a: MirrorPrep, b?: MirrorPrep): PlotData {
  const [lo0, hi0] = spanOf([...a.covers, ...(b?.covers ?? [])], q.lambdaNm);
  const pad = Math.max(5, 0.08 * (hi0 - lo0));
  const lo = lo0 - pad;
  const hi = hi0 + pad;
  const x: number[] = [];
  const nominal: (number | null)[] = [];
  const worst: (number | null)[] = [];
  for (let i = 0; i < PLOT_POINTS; i++) {
    const nm = lo + ((hi - lo) * i) / (PLOT_POINTS - 1);
    const ma = mirrorAt(a, nm);
    const m1 = q.own ?? ma;
    const m2 = b ? mirrorAt(b, nm) : ma;
    let fn: number | null = null;
    let fw: number | null = null;
    if (m1 !== null && m2 !== null) {
      try {
        fn = finesseOf(m1.totalPpm, m2.totalPpm, q.extraLoss);
        fw = finesseOf(m1.totalWorstPpm, m2.totalWorstPpm, q.extraLoss);
      } catch (e) {
        if (!(e instanceof FitInputError)) throw e;
      }
    }
    x.push(Number(nm.toFixed(3)));
    nominal.push(fn);
    worst.push(fw);
  }
  return {
    title: 'Finesse across the coating band',
    xLabel: 'wavelength (nm)',
    yLabel: 'finesse',
    x,
    series: [
      { label: 'nominal', values: nominal },
      { label: 'worst case', values: worst },
      { label: 'goal', values: x.map(() => q.goalFinesse), dashed: true },
    ],
    markerX: q.lambdaNm,
  };
}

/** The goal as the spec a mirror needs: the finesse, and the T + loss budget per mirror (form 1.11). */
export function cavityHeadline(q: CavityQuery): Headline[] {
  const out: Headline[] = [
    { label: 'Finesse needed', value: `${formatCount(q.goalFinesse)} (free spectral range ${formatSI(q.fsrHz, 'Hz')})` },
  ];
  const r = requiredReflectivity(
    q.own === null
      ? { finesse: q.goalFinesse, extraLoss: q.extraLoss }
      : { finesse: q.goalFinesse, r1: 1 - q.own.totalPpm * PPM, extraLoss: q.extraLoss },
  );
  const who =
    q.own !== null
      ? 'The listed mirror, with yours'
      : q.goal.configuration === 'pair'
        ? 'Each mirror of the pair'
        : 'Each mirror, if both are alike';
  out.push({
    label: `${who}: T + loss at most`,
    value: r.feasible ? `${formatCount(r.lossBudget / PPM)}${THIN}ppm` : `none reaches it: ${r.reason}`,
  });
  return out;
}
