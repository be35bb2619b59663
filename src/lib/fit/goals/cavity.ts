// Cavity goal: finesse, linewidth or storage time for the buyer's wavelength and length, from two
// mirrors (physics.md A1 forms 1.1, 1.3, 1.6–1.8, 1.10; A2 forms 2.1–2.7; A3 for the roughness
// check; A4 for the optional cooperativity).
// Sources: E. Hecht, "Optics", 5th ed. (2017), §9.6; B. E. A. Saleh and M. C. Teich, "Fundamentals
// of Photonics", 2nd ed. (2007), ch. 10; H. Kogelnik and T. Li, "Laser Beams and Resonators", Appl.
// Opt. 5, 1550 (1966); H. Davies, Proc. IEE 101, 209 (1954); H. Tanji-Suzuki et al., Adv. At. Mol.
// Opt. Phys. 60, 201 (2011).

import { cavityLinewidth, finesseFromMirrorLosses, freeSpectralRange, lossFromRingdown, storageTime } from '../cavity';
import { SPEED_OF_LIGHT } from '../constants';
import { cqed } from '../cqed';
import { FitInputError } from '../errors';
import { interpolateCurve } from '../interpolate';
import { gaussianMode, type GaussianMode } from '../modes';
import { totalIntegratedScatter } from '../scatter';
import { finite, inRange, nonNegative, oneOf, positive, powerFraction, requireObject } from '../validate';
import { fmt, formatHz, formatLength, formatNm, formatSeconds } from './format';
import { exact, nearWavelength, readCurve, spread, type Spread } from './spec';
import type { CavityGoal, CavityGoalResult, CavityTarget, MirrorAtWavelength, MirrorSpec, OwnMirror } from './types';
import { headroomOf, verdictOf, type Better } from './verdict';

const PPM = 1e-6;
/** A total round-trip loss under which the cavity counts as lossless (its finesse would overflow). */
const NO_LOSS = 1e-300;

/**
 * A coating specified beyond this angle of incidence is not specified for the normal incidence of a
 * two-mirror linear cavity (the band shifts and splits by polarisation at oblique incidence).
 */
const MAX_AOI_DEG = 5;

const FORMULA =
  'ℱ = π·ρ^¼/(1 − √ρ), ρ = (1 − T1 − A1)(1 − T2 − A2)(1 − L_rt); FSR = c/(2L); Δν = FSR/ℱ; τ = ℱ/(2π·FSR); g_i = 1 − L/R_i, stable for 0 < g1·g2 < 1';
const SOURCE =
  'Hecht, Optics 5th ed. (2017) §9.6; Saleh & Teich, Fundamentals of Photonics 2nd ed. (2007) ch. 10; Kogelnik & Li, Appl. Opt. 5, 1550 (1966) (physics.md A1 forms 1.3, 1.6–1.8; A2)';

export interface MirrorReading {
  mirror: MirrorAtWavelength | null;
  /** Why this mirror cannot serve at the wavelength (out of band, oblique coating). */
  blocking: string | null;
  notes: string[];
}

function rocOf(field: string, rocMm: unknown): number | null {
  if (rocMm === null) return null;
  const r = finite(field, rocMm);
  if (r === 0) throw new FitInputError(field, 'must be a non-zero radius in mm, or null for a flat mirror');
  return r * 1e-3;
}

/** gaussianMode takes a flat mirror as an infinite radius. */
export function modeRadius(rocM: number | null): number {
  return rocM ?? Infinity;
}

/** A mirror reading from its T and loss spreads (ppm); null when T + loss is not below 1e6 ppm. The search shares it. */
export function readingFromTotals(
  source: MirrorAtWavelength['source'],
  t: Spread,
  a: Spread,
  rocM: number | null,
): MirrorAtWavelength | null {
  const total = t.nominal + a.nominal;
  if (!(total < 1e6)) return null;
  return {
    source,
    transmissionPpm: t.nominal,
    lossPpm: a.nominal,
    totalPpm: total,
    totalWorstPpm: Math.min(t.high + a.high, 999_999),
    totalBestPpm: t.low + a.low,
    rocM,
  };
}

function fromTotals(source: MirrorAtWavelength['source'], t: Spread, a: Spread, rocM: number | null, field: string): MirrorAtWavelength {
  const reading = readingFromTotals(source, t, a, rocM);
  if (!reading) throw new FitInputError(`${field}.transmissionPpm`, 'T + loss must be below 1e6 ppm');
  return reading;
}

function spectrumRange(points: readonly { wavelengthNm: number }[]): string {
  let lo = Infinity;
  let hi = -Infinity;
  for (const p of points) {
    lo = Math.min(lo, p.wavelengthNm);
    hi = Math.max(hi, p.wavelengthNm);
  }
  return `${fmt(lo, 6)}–${fmt(hi, 6)} nm`;
}

/**
 * One listing mirror's T and loss at the buyer's wavelength. Priority: a ring-down within 1 nm
 * (its per-mirror total loss from form 1.10 replaces T + loss; the total is all the finesse needs,
 * so T is kept from the spectrum or spec for display and the loss is the remainder, floored at 0);
 * then a measured spectrum covering the wavelength (linear interpolation, no extrapolation, taken
 * as exact; a spectrum without loss values borrows the spec's loss); then the spec inside the
 * coating band (± tolerances); otherwise out of band.
 */
export function mirrorAtWavelength(mirror: MirrorSpec, wavelengthNm: number, field = 'mirror'): MirrorReading {
  const m = requireObject(field, mirror) as unknown as MirrorSpec;
  const lambda = positive('wavelengthNm', wavelengthNm);
  positive(`${field}.diameterMm`, m.diameterMm);
  positive(`${field}.designWavelengthNm`, m.designWavelengthNm);
  const bandMin = positive(`${field}.bandMinNm`, m.bandMinNm);
  const bandMax = positive(`${field}.bandMaxNm`, m.bandMaxNm);
  if (bandMin > bandMax) throw new FitInputError(`${field}.bandMinNm`, 'must not exceed bandMaxNm');
  const aoi = inRange(`${field}.aoiDeg`, m.aoiDeg, 0, 89.999, 'must be an angle of incidence in degrees');
  const rocM = rocOf(`${field}.rocMm`, m.rocMm);
  const specT = spread(`${field}.transmissionPpm`, m.transmissionPpm, 1e6);
  const specA = spread(`${field}.lossPpm`, m.lossPpm, 1e6);
  const notes: string[] = [];

  if (aoi > MAX_AOI_DEG) {
    return {
      mirror: null,
      blocking: `coating specified at ${fmt(aoi)}° incidence; a two-mirror linear cavity needs normal incidence`,
      notes,
    };
  }

  let t: Spread | null = null;
  let a: Spread | null = null;
  let source: MirrorAtWavelength['source'] = 'spec';
  const spectrum = m.spectrum;
  if (spectrum !== undefined) {
    const pts = requireObject(`${field}.spectrum`, spectrum).points;
    const tPoints = readCurve(`${field}.spectrum.points`, pts, 'wavelengthNm', 'transmissionPpm', nonNegative);
    const tAt = interpolateCurve(`${field}.spectrum.points`, tPoints, lambda);
    if (tAt !== null) {
      t = exact(tAt);
      source = 'spectrum';
      const lossPoints = spectrum.points.flatMap((p, i) =>
        p.lossPpm === undefined ? [] : [{ x: p.wavelengthNm, y: nonNegative(`${field}.spectrum.points[${i}].lossPpm`, p.lossPpm) }],
      );
      const aAt = lossPoints.length === 0 ? null : interpolateCurve(`${field}.spectrum.points`, lossPoints, lambda);
      a = aAt === null ? specA : exact(aAt);
      if (aAt === null) notes.push('measured spectrum gives T only; loss taken from the spec');
    }
  }
  const inBand = lambda >= bandMin && lambda <= bandMax;
  if (t === null && inBand) {
    t = specT;
    a = specA;
  }

  const ringdown = m.ringdown;
  if (ringdown !== undefined) {
    const rd = requireObject(`${field}.ringdown`, ringdown);
    const rdLambda = positive(`${field}.ringdown.wavelengthNm`, rd.wavelengthNm);
    if (nearWavelength(rdLambda, lambda)) {
      const lengthM = positive(`${field}.ringdown.lengthM`, rd.lengthM);
      const tauS = positive(`${field}.ringdown.tauS`, rd.tauS);
      if (!(tauS > (2 * lengthM) / SPEED_OF_LIGHT)) {
        throw new FitInputError(`${field}.ringdown.tauS`, 'is not longer than the round-trip time; form 1.10 needs τ ≫ 2L/c');
      }
      const loss = lossFromRingdown({ lengthM, tauS });
      const total = loss.perMirrorLoss / PPM;
      const tKnown = Math.min(t === null ? specT.nominal : t.nominal, total);
      notes.push(
        `ring-down τ = ${formatSeconds(ringdown.tauS)} at ${formatNm(rdLambda)} in ${formatLength(ringdown.lengthM)}: ${fmt(total)} ppm total loss per mirror replaces T + loss`,
      );
      return {
        mirror: fromTotals('ring-down', exact(tKnown), exact(total - tKnown), rocM, field),
        blocking: null,
        notes,
      };
    }
  }

  if (t === null || a === null) {
    const covered = spectrum === undefined ? '' : ` and the measured spectrum (${spectrumRange(spectrum.points)})`;
    return {
      mirror: null,
      blocking: `out of band: coating band ${fmt(bandMin, 6)}–${fmt(bandMax, 6)} nm${covered} does not cover ${formatNm(lambda)}`,
      notes,
    };
  }

  if (m.roughnessNm !== undefined) {
    const tis = totalIntegratedScatter({
      roughnessM: nonNegative(`${field}.roughnessNm`, m.roughnessNm) * 1e-9,
      wavelengthM: lambda * 1e-9,
    });
    if (tis / PPM > a.nominal) {
      notes.push(
        `roughness ${fmt(m.roughnessNm)} nm rms implies about ${fmt(tis / PPM)} ppm scatter at ${formatNm(lambda)} (TIS, Bennett & Porteus 1961), above the stated loss ${fmt(a.nominal)} ppm; the rms may refer to another spatial-frequency band`,
      );
    }
  }
  return { mirror: fromTotals(source, t, a, rocM, field), blocking: null, notes };
}

function ownMirrorReading(own: OwnMirror | undefined): MirrorReading {
  if (own === undefined) throw new FitInputError('goal.ownMirror', 'is required for the with-own-mirror configuration');
  const o = requireObject('goal.ownMirror', own);
  const rocM = rocOf('goal.ownMirror.rocMm', o.rocMm);
  let t: number;
  let a: number;
  if ('reflectivity' in own) {
    const r = powerFraction('goal.ownMirror.reflectivity', own.reflectivity);
    t = (1 - r) / PPM;
    a = 0;
  } else {
    t = nonNegative('goal.ownMirror.transmissionPpm', own.transmissionPpm);
    a = nonNegative('goal.ownMirror.lossPpm', own.lossPpm);
  }
  return { mirror: fromTotals('own', exact(t), exact(a), rocM, 'goal.ownMirror'), blocking: null, notes: [] };
}

export interface ParsedCavityGoal {
  lambdaNm: number;
  lengthM: number;
  target: CavityTarget;
  extraLoss: number;
  fsrHz: number;
  goalFinesse: number;
  atom: { atomNm: number; gammaHz: number } | null;
}

export function parseCavityGoal(goal: CavityGoal): ParsedCavityGoal {
  const g = requireObject('goal', goal) as unknown as CavityGoal;
  const lambdaNm = positive('goal.wavelengthNm', g.wavelengthNm);
  const lengthM = positive('goal.lengthM', g.lengthM);
  oneOf('goal.configuration', g.configuration, ['pair', 'with-own-mirror', 'two-listings'] as const);
  const extraLoss = g.extraLossPpm === undefined ? 0 : powerFraction('goal.extraLossPpm', g.extraLossPpm * PPM);
  const fsrHz = freeSpectralRange({ lengthM });
  const target = requireObject('goal.target', g.target) as unknown as CavityTarget;
  const kind = oneOf('goal.target.kind', target.kind, ['finesse', 'linewidth', 'storage-time'] as const);
  let goalFinesse: number;
  if (kind === 'finesse') goalFinesse = positive('goal.target.value', (target as { value: number }).value);
  else if (kind === 'linewidth') goalFinesse = fsrHz / positive('goal.target.hz', (target as { hz: number }).hz);
  else goalFinesse = 2 * Math.PI * fsrHz * positive('goal.target.s', (target as { s: number }).s);
  if (!Number.isFinite(goalFinesse)) throw new FitInputError('goal.target', 'the target is out of range for this length');
  let atom: ParsedCavityGoal['atom'] = null;
  if (g.atom !== undefined) {
    const a = requireObject('goal.atom', g.atom);
    atom = { atomNm: positive('goal.atom.wavelengthNm', a.wavelengthNm), gammaHz: positive('goal.atom.gammaHz', a.gammaHz) };
  }
  return { lambdaNm, lengthM, target, extraLoss, fsrHz, goalFinesse, atom };
}

/** Form 1.3 from the two mirrors' T + loss (ppm) and the extra loss; null when nothing is lost. The search shares it. */
export function finesseOf(loss1Ppm: number, loss2Ppm: number, extraLoss: number): number | null {
  // below this the finesse (≈ 2π / total loss) leaves the doubles: as good as lossless
  if (loss1Ppm * PPM + loss2Ppm * PPM + extraLoss < NO_LOSS) return null;
  return finesseFromMirrorLosses({ loss1: loss1Ppm * PPM, loss2: loss2Ppm * PPM, extraLoss });
}

/** The buyer's figure (finesse, linewidth or storage time) for a finesse at this length. */
function figureOf(kind: CavityTarget['kind'], f: number, lengthM: number): number {
  if (kind === 'finesse') return f;
  if (kind === 'linewidth') return cavityLinewidth({ lengthM, finesse: f });
  return storageTime({ lengthM, finesse: f });
}

const UNIT: Record<CavityTarget['kind'], string> = { finesse: '', linewidth: 'Hz', 'storage-time': 's' };
const BETTER: Record<CavityTarget['kind'], Better> = { finesse: 'higher', linewidth: 'lower', 'storage-time': 'higher' };

function describeFigure(kind: CavityTarget['kind'], x: number): string {
  if (kind === 'finesse') return `finesse ${fmt(x)}`;
  if (kind === 'linewidth') return `linewidth ${formatHz(x)}`;
  return `storage time ${formatSeconds(x)}`;
}

function stabilityReason(mode: GaussianMode, lengthM: number): string | null {
  if (mode.stable) return null;
  const geometry = `g1·g2 = ${mode.g1g2.toFixed(2)} for ${formatLength(lengthM)} with these radii`;
  return mode.marginal ? `marginally stable: ${geometry} (no finite Gaussian mode)` : `unstable: ${geometry}`;
}

/** Gaussian power fraction outside a centred aperture of radius a: exp(−2a²/w²). */
function clippingLoss(diameterMm: number, wM: number): number {
  const a = (diameterMm * 1e-3) / 2;
  return Math.exp((-2 * a * a) / (wM * wM));
}

function readings(
  goal: CavityGoal,
  lambdaNm: number,
  mirrorA: MirrorSpec,
  mirrorB: MirrorSpec | undefined,
): [MirrorReading, MirrorReading] {
  if (goal.configuration === 'pair') {
    if (mirrorB !== undefined) throw new FitInputError('mirrorB', 'must be omitted: pair uses two units of one listing');
    const r = mirrorAtWavelength(mirrorA, lambdaNm, 'mirrorA');
    return [r, r];
  }
  if (goal.configuration === 'with-own-mirror') {
    if (mirrorB !== undefined) throw new FitInputError('mirrorB', 'must be omitted: with-own-mirror uses the buyer’s mirror as mirror 1');
    return [ownMirrorReading(goal.ownMirror), mirrorAtWavelength(mirrorA, lambdaNm, 'mirrorA')];
  }
  if (mirrorB === undefined) throw new FitInputError('mirrorB', 'is required for the two-listings configuration');
  return [mirrorAtWavelength(mirrorA, lambdaNm, 'mirrorA'), mirrorAtWavelength(mirrorB, lambdaNm, 'mirrorB')];
}

/**
 * The cavity goal against one listing (pair), the buyer's mirror plus a listing (with-own-mirror,
 * mirror 1 = the buyer's) or two listings. Finesse by form 1.3 with the buyer's extra loss; the worst
 * case takes every T and loss at +tol (the finesse falls with each, form 12.5). A linewidth goal Δν
 * is the finesse goal FSR/Δν and a storage-time goal τ is 2π·FSR·τ at the buyer's length.
 */
export function evaluateCavityGoal(goal: CavityGoal, mirrorA: MirrorSpec, mirrorB?: MirrorSpec): CavityGoalResult {
  const parsed = parseCavityGoal(goal);
  const { lambdaNm, lengthM, target, extraLoss, fsrHz, goalFinesse } = parsed;
  const [r1, r2] = readings(goal, lambdaNm, mirrorA, mirrorB);
  const reasons: string[] = [];
  const notes: string[] = r2 === r1 ? r1.notes.slice() : r1.notes.concat(r2.notes);
  if (r1.blocking !== null) reasons.push(goal.configuration === 'pair' ? r1.blocking : `mirror 1: ${r1.blocking}`);
  if (r2.blocking !== null && r2 !== r1) reasons.push(`mirror 2: ${r2.blocking}`);
  const m1 = r1.mirror;
  const m2 = r2.mirror;
  const kind = target.kind;
  const better = BETTER[kind];
  const goalFigure = kind === 'finesse' ? goalFinesse : kind === 'linewidth' ? (target as { hz: number }).hz : (target as { s: number }).s;

  const mirrors: [MirrorAtWavelength | null, MirrorAtWavelength | null] = [m1, m2];
  if (m1 === null || m2 === null) {
    return {
      target: kind,
      goalFinesse,
      fsrHz,
      unit: UNIT[kind],
      goal: goalFigure,
      formula: FORMULA,
      source: SOURCE,
      mirrors,
      pass: false,
      verdict: 'does-not-fit',
      figure: null,
      worst: null,
      headroom: null,
      reasons,
      notes,
      finesse: null,
      linewidthHz: null,
      storageTimeS: null,
      stable: false,
      g1: null,
      g2: null,
      g1g2: null,
      waistM: null,
      waistFromMirror1M: null,
      spotOnMirror1M: null,
      spotOnMirror2M: null,
      cooperativity: null,
    };
  }

  const nominalF = finesseOf(m1.totalPpm, m2.totalPpm, extraLoss);
  if (nominalF === null) {
    throw new FitInputError('mirrorA.lossPpm', 'T + loss is 0 ppm on both mirrors with no extra loss: the finesse is unbounded');
  }
  const worstF = finesseOf(m1.totalWorstPpm, m2.totalWorstPpm, extraLoss) ?? nominalF;
  const bestF = finesseOf(m1.totalBestPpm, m2.totalBestPpm, extraLoss);
  const figure = figureOf(kind, nominalF, lengthM);
  const worst = figureOf(kind, worstF, lengthM);

  const mode = gaussianMode({ lengthM, roc1M: modeRadius(m1.rocM), roc2M: modeRadius(m2.rocM), wavelengthM: lambdaNm * 1e-9 });
  const unstable = stabilityReason(mode, lengthM);
  if (unstable !== null) reasons.push(unstable);
  else if (mode.marginal && mode.reason !== null) notes.push(mode.reason);

  if (mode.w1M !== null && mode.w2M !== null) {
    const diameters = [goal.configuration === 'with-own-mirror' ? null : mirrorA.diameterMm, mirrorB?.diameterMm ?? mirrorA.diameterMm];
    const spots = [mode.w1M, mode.w2M];
    for (let i = 0; i < 2; i++) {
      const d = diameters[i];
      const w = spots[i] as number;
      if (d === null || d === undefined) continue;
      const clip = clippingLoss(d, w);
      if (clip > PPM) {
        notes.push(
          `beam radius ${formatLength(w)} on the ${fmt(d)} mm mirror ${i + 1}: about ${fmt(clip / PPM)} ppm clipping per bounce, not included`,
        );
      }
    }
  }

  let verdict = verdictOf(figure, worst, goalFigure, better);
  let headroom: number | null = headroomOf(worst, goalFigure, better);
  if (reasons.length > 0) {
    verdict = 'does-not-fit';
    headroom = null;
  } else if (verdict === 'marginal') {
    reasons.push(
      `worst case ${describeFigure(kind, worst)} (T and loss at +tol) misses the goal ${describeFigure(kind, goalFigure)}; nominal ${describeFigure(kind, figure)} meets it`,
    );
  } else if (verdict === 'does-not-fit') {
    reasons.push(`${describeFigure(kind, figure)} misses the goal ${describeFigure(kind, goalFigure)}`);
  }
  let cooperativity: CavityGoalResult['cooperativity'] = null;
  if (parsed.atom !== null) {
    const { atomNm, gammaHz } = parsed.atom;
    if (!nearWavelength(atomNm, lambdaNm)) {
      notes.push(
        `atom line ${formatNm(atomNm)} differs from the cavity wavelength ${formatNm(lambdaNm)}; finesse taken at ${formatNm(lambdaNm)}`,
      );
    }
    if (mode.w0M !== null) {
      const atomMode = gaussianMode({ lengthM, roc1M: modeRadius(m1.rocM), roc2M: modeRadius(m2.rocM), wavelengthM: atomNm * 1e-9 });
      const q = cqed({ wavelengthM: atomNm * 1e-9, gammaHz, lengthM, waistM: atomMode.w0M ?? mode.w0M, finesse: nominalF });
      cooperativity = { g0Hz: q.g0Hz, kappaHz: q.kappaHz, gammaHz: q.gammaHz, c1: q.c1, eta: q.eta, strongCoupling: q.strongCoupling };
      notes.push(
        'cooperativity C1 = g0²/(2κγ) (half widths) for a two-level atom at an antinode on the axis at the waist; η = 2·C1 is the ensemble convention',
      );
    }
  }

  // A full literal rather than a spread of shared fields: see the note in modes.ts on V8 spreads.
  return {
    target: kind,
    goalFinesse,
    fsrHz,
    unit: UNIT[kind],
    goal: goalFigure,
    formula: FORMULA,
    source: SOURCE,
    mirrors,
    pass: verdict === 'fits',
    verdict,
    figure,
    worst,
    headroom,
    reasons,
    notes,
    finesse: { nominal: nominalF, worst: worstF, best: bestF },
    linewidthHz: { nominal: figureOf('linewidth', nominalF, lengthM), worst: figureOf('linewidth', worstF, lengthM) },
    storageTimeS: { nominal: figureOf('storage-time', nominalF, lengthM), worst: figureOf('storage-time', worstF, lengthM) },
    stable: mode.stable,
    g1: mode.g1,
    g2: mode.g2,
    g1g2: mode.g1g2,
    waistM: mode.w0M,
    waistFromMirror1M: mode.waistFromMirror1M,
    spotOnMirror1M: mode.w1M,
    spotOnMirror2M: mode.w2M,
    cooperativity,
  };
}
