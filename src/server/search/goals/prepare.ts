/**
 * A listing's fit-engine input, read once when it enters the index: where on the spectrum it can have
 * values at all (so a search evaluates only listings that may cover the buyer's wavelength), and for a
 * mirror its T and loss read as mirrorAtWavelength reads them: checked once, the spec's values inside
 * the coating band (the same at every wavelength there), a measured spectrum as points to interpolate
 * and a ring-down as its loss (form 1.10). Per search, mirrorAt follows mirrorAtWavelength's order of
 * precedence on these (tests/unit/search/rank-keys.test.ts holds them equal).
 */
import {
  FitInputError,
  interpolateCurve,
  lossFromRingdown,
  mirrorAtWavelength,
  SINGLE_WAVELENGTH_MATCH_NM,
  type CurvePoint,
  type LaserSpec,
  type MirrorAtWavelength,
  type MirrorSpec,
  type PhotodiodeSpec,
  type SinglePhotonDetectorSpec,
} from '../../../lib/fit';
import { readingFromTotals } from '../../../lib/fit/goals/cavity';
import { exact, nearWavelength, readCurve, spread, type Spread } from '../../../lib/fit/goals/spec';
import { nonNegative } from '../../../lib/fit/validate';
import type { SearchDoc } from '../documents';
import { readDetector, type DetectorReading } from './detector-reading';
import { lerpSorted } from './lerp';

export type Span = readonly [number, number];

export type Prepared =
  | {
      kind: 'mirror';
      spec: MirrorSpec;
      /** Wavelengths where mirrorAtWavelength may give values: band, measured spectrum, ring-down ± 1 nm; empty when never. */
      covers: Span[];
      /** The mirror's values anywhere in its coating band where no measurement applies. */
      inBand: MirrorAtWavelength | null;
      measured: MeasuredMirror | null;
    }
  | { kind: 'photodiode'; spec: PhotodiodeSpec; covers: Span[]; read: DetectorReading | null }
  | { kind: 'counter'; spec: SinglePhotonDetectorSpec; covers: Span[] }
  | { kind: 'laser'; spec: LaserSpec }
  | null;

export function covers(spans: readonly Span[], nm: number): boolean {
  for (const [lo, hi] of spans) if (nm >= lo && nm <= hi) return true;
  return false;
}

function curveSpan<K extends string>(points: readonly Record<K, number>[] | undefined, key: K): Span[] {
  if (!points || points.length === 0) return [];
  let lo = Infinity;
  let hi = -Infinity;
  for (const p of points) {
    lo = Math.min(lo, p[key]);
    hi = Math.max(hi, p[key]);
  }
  return [[lo, hi]];
}

function around(nm: number | undefined): Span[] {
  return nm === undefined ? [] : [[nm - SINGLE_WAVELENGTH_MATCH_NM, nm + SINGLE_WAVELENGTH_MATCH_NM]];
}

/** A mirror's measurements as mirrorAtWavelength uses them, read once. */
interface MeasuredMirror {
  t: Spread;
  a: Spread;
  rocM: number | null;
  bandMinNm: number;
  bandMaxNm: number;
  spectrumT: CurvePoint[] | null;
  spectrumLoss: CurvePoint[] | null;
  ringdownNm: number | null;
  /** Total loss per mirror from the ring-down, ppm. */
  ringdownPpm: number;
}

const fromTotals = readingFromTotals;

function readMeasurements(spec: MirrorSpec, rocM: number | null): MeasuredMirror {
  const points = spec.spectrum?.points;
  // checked and sorted once, for lerpSorted
  const byX = (a: CurvePoint, b: CurvePoint) => a.x - b.x;
  const spectrumT =
    points === undefined ? null : readCurve('mirror.spectrum.points', points, 'wavelengthNm', 'transmissionPpm', nonNegative).sort(byX);
  const withLoss = (points ?? [])
    .flatMap((p, i) =>
      p.lossPpm === undefined ? [] : [{ x: p.wavelengthNm, y: nonNegative(`mirror.spectrum.points[${i}].lossPpm`, p.lossPpm) }],
    )
    .sort(byX);
  if (spectrumT !== null) interpolateCurve('mirror.spectrum.points', spectrumT, spectrumT[0]?.x ?? 0);
  if (withLoss.length > 0) interpolateCurve('mirror.spectrum.points', withLoss, withLoss[0]!.x);
  const rd = spec.ringdown;
  return {
    t: spread('mirror.transmissionPpm', spec.transmissionPpm, 1e6),
    a: spread('mirror.lossPpm', spec.lossPpm, 1e6),
    rocM,
    bandMinNm: spec.bandMinNm,
    bandMaxNm: spec.bandMaxNm,
    spectrumT,
    spectrumLoss: withLoss.length > 0 ? withLoss : null,
    ringdownNm: rd === undefined ? null : rd.wavelengthNm,
    ringdownPpm: rd === undefined ? NaN : lossFromRingdown({ lengthM: rd.lengthM, tauS: rd.tauS }).perMirrorLoss / 1e-6,
  };
}

/** mirrorAtWavelength's precedence: ring-down within 1 nm, else measured spectrum, else the spec in band. */
function measuredAt(m: MeasuredMirror, nm: number): MirrorAtWavelength | null {
  let t: Spread | null = null;
  let a: Spread | null = null;
  let source: MirrorAtWavelength['source'] = 'spec';
  if (m.spectrumT !== null) {
    const tAt = lerpSorted(m.spectrumT, nm);
    if (tAt !== null) {
      t = exact(tAt);
      source = 'spectrum';
      const aAt = m.spectrumLoss === null ? null : lerpSorted(m.spectrumLoss, nm);
      a = aAt === null ? m.a : exact(aAt);
    }
  }
  if (t === null && nm >= m.bandMinNm && nm <= m.bandMaxNm) {
    t = m.t;
    a = m.a;
  }
  if (m.ringdownNm !== null && nearWavelength(m.ringdownNm, nm)) {
    const total = m.ringdownPpm;
    const tKnown = Math.min(t === null ? m.t.nominal : t.nominal, total);
    return fromTotals('ring-down', exact(tKnown), exact(total - tKnown), m.rocM);
  }
  if (t === null || a === null) return null;
  return fromTotals(source, t, a, m.rocM);
}

function prepareMirror(spec: MirrorSpec): Prepared {
  const hasMeasurement = spec.spectrum !== undefined || spec.ringdown !== undefined;
  const probeNm = Math.min(Math.max(spec.designWavelengthNm, spec.bandMinNm), spec.bandMaxNm);
  const none: Prepared = { kind: 'mirror', spec, covers: [], inBand: null, measured: null };
  try {
    // The engine's own reading checks every field once (and refuses an oblique coating).
    const inBand = mirrorAtWavelength({ ...spec, spectrum: undefined, ringdown: undefined }, probeNm).mirror;
    if (inBand === null) return none;
    if (hasMeasurement) mirrorAtWavelength(spec, spec.ringdown?.wavelengthNm ?? probeNm);
    const spans: Span[] = [[spec.bandMinNm, spec.bandMaxNm]];
    if (spec.spectrum) spans.push(...curveSpan(spec.spectrum.points, 'wavelengthNm'));
    if (spec.ringdown) spans.push(...around(spec.ringdown.wavelengthNm));
    return { kind: 'mirror', spec, covers: spans, inBand, measured: hasMeasurement ? readMeasurements(spec, inBand.rocM) : null };
  } catch (e) {
    if (!(e instanceof FitInputError)) throw e;
    return none;
  }
}

export function prepare(doc: SearchDoc): Prepared {
  const c = doc.candidate;
  switch (c.kind) {
    case 'mirror':
      return prepareMirror(c.spec);
    case 'photodiode': {
      const read = readDetector(c.spec);
      return {
        kind: 'photodiode',
        spec: c.spec,
        covers: read === null ? [] : [...curveSpan(c.spec.qeCurve, 'wavelengthNm'), ...around(c.spec.wavelengthNm)],
        read,
      };
    }
    case 'counter':
      return {
        kind: 'counter',
        spec: c.spec,
        covers: [...curveSpan(c.spec.efficiencyCurve, 'wavelengthNm'), ...around(c.spec.wavelengthNm)],
      };
    case 'laser':
      return { kind: 'laser', spec: c.spec };
    default:
      return null;
  }
}

/** The mirror's T and loss at the wavelength as mirrorAtWavelength gives them, or null where it has none. */
export function mirrorAt(p: Extract<Prepared, { kind: 'mirror' }>, nm: number): MirrorAtWavelength | null {
  if (!covers(p.covers, nm)) return null;
  return p.measured === null ? p.inBand : measuredAt(p.measured, nm);
}

/** The smallest span holding every wavelength the listing may have values at: [NaN, NaN] for none, everything for a laser (judged by its tuning range). */
export function envelope(p: Prepared): Span {
  if (p === null) return [NaN, NaN];
  if (p.kind === 'laser') return [-Infinity, Infinity];
  if (p.covers.length === 0) return [NaN, NaN];
  let lo = Infinity;
  let hi = -Infinity;
  for (const [a, b] of p.covers) {
    lo = Math.min(lo, a);
    hi = Math.max(hi, b);
  }
  return [lo, hi];
}
