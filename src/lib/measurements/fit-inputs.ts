// Measured data as the fit engine's inputs: a mirror's spectrum and ring-down, a photodiode's QE
// curve, a single-photon detector's efficiency curve. A listing's fit input is its stored specs
// plus these, e.g. { ...specs, spectrum: toMirrorSpectrum(data) }.

import { interpolateCurve, type CurvePoint, type MirrorSpectrum, type RingdownMeasurement } from '../fit';
import type { EfficiencyCurveData, MeasurementData, RingdownData } from './types';

/** The transmission (and loss) spectrum; null for a reflectance-only file, which the fit cannot split into T and loss. */
export function toMirrorSpectrum(data: MeasurementData): MirrorSpectrum | null {
  if (data.kind !== 'spectrum' || data.quantity === 'reflectance') return null;
  return { points: data.points };
}

/**
 * The ring-down as the cavity evaluator takes it. The file's own wavelength and length win; the
 * listing supplies them when the file does not say (its design wavelength, the seller's stated
 * test-cavity length). null when the length is unknown.
 */
export function toRingdownMeasurement(
  data: RingdownData,
  fallback: { wavelengthNm: number; lengthM?: number },
): RingdownMeasurement | null {
  const lengthM = data.lengthM ?? fallback.lengthM ?? null;
  if (lengthM === null) return null;
  return { wavelengthNm: data.wavelengthNm ?? fallback.wavelengthNm, lengthM, tauS: data.fit.tauS };
}

/** A photodiode's PhotodiodeSpec.qeCurve. */
export function toQeCurve(data: EfficiencyCurveData): { wavelengthNm: number; qe: number }[] {
  return data.points.map((p) => ({ wavelengthNm: p.wavelengthNm, qe: p.efficiency }));
}

/** A single-photon detector's SinglePhotonDetectorSpec.efficiencyCurve. */
export function toEfficiencyCurve(data: EfficiencyCurveData): { wavelengthNm: number; efficiency: number }[] {
  return data.points.map((p) => ({ wavelengthNm: p.wavelengthNm, efficiency: p.efficiency }));
}

/** Linear interpolation between measured points, null outside them (physics.md A12 form 12.6: never extrapolate). */
export function interpolateAt(points: readonly CurvePoint[], x: number): number | null {
  return points.length === 0 ? null : interpolateCurve('points', points, x);
}

/** Points of a measurement as { x, y } for interpolateAt or a plot, e.g. curveOf(data.points, 'wavelengthNm', 'transmissionPpm'). */
export function curveOf<P, X extends keyof P, Y extends keyof P>(points: readonly P[], x: X, y: Y): CurvePoint[] {
  return points.map((p) => ({ x: p[x] as number, y: p[y] as number }));
}
