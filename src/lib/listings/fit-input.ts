/**
 * A listing's stored specs plus its parsed measurement files, as the fit engine's input for its
 * category: a measured spectrum, ring-down or efficiency curve is attached where the engine uses it.
 */
import type { LaserSpec, MirrorSpec, PhotodiodeSpec, SinglePhotonDetectorSpec } from '../fit';
import type { MeasurementData } from '../measurements/types';
import type { Category } from './constants';

export type FitCandidate =
  | { kind: 'mirror'; spec: MirrorSpec }
  | { kind: 'photodiode'; spec: PhotodiodeSpec }
  | { kind: 'counter'; spec: SinglePhotonDetectorSpec }
  | { kind: 'laser'; spec: LaserSpec }
  | { kind: 'none' };

export function fitCandidate(category: Category, specs: Record<string, unknown>, measurements: readonly MeasurementData[] = []): FitCandidate {
  switch (category) {
    case 'cavity-mirror': {
      const spec = { ...(specs as unknown as MirrorSpec) };
      for (const m of measurements) {
        if (m.kind === 'spectrum' && m.quantity !== 'reflectance' && !spec.spectrum) {
          spec.spectrum = { points: m.points.map((p) => ({ wavelengthNm: p.wavelengthNm, transmissionPpm: p.transmissionPpm, ...('lossPpm' in p ? { lossPpm: p.lossPpm } : {}) })) };
        }
        if (m.kind === 'ringdown' && !spec.ringdown && m.lengthM !== null) {
          spec.ringdown = { wavelengthNm: m.wavelengthNm ?? spec.designWavelengthNm, lengthM: m.lengthM, tauS: m.fit.tauS };
        }
      }
      return { kind: 'mirror', spec };
    }
    case 'photodiode':
    case 'balanced-detector': {
      const spec = { ...(specs as unknown as PhotodiodeSpec) };
      const curve = measurements.find((m) => m.kind === 'efficiency-curve');
      if (curve && curve.kind === 'efficiency-curve' && !spec.qeCurve) spec.qeCurve = curve.points.map((p) => ({ wavelengthNm: p.wavelengthNm, qe: p.efficiency }));
      return { kind: 'photodiode', spec };
    }
    case 'single-photon-detector': {
      const spec = { ...(specs as unknown as SinglePhotonDetectorSpec) };
      const curve = measurements.find((m) => m.kind === 'efficiency-curve');
      if (curve && curve.kind === 'efficiency-curve' && !spec.efficiencyCurve) spec.efficiencyCurve = curve.points.map((p) => ({ wavelengthNm: p.wavelengthNm, efficiency: p.efficiency }));
      return { kind: 'counter', spec };
    }
    case 'laser':
      return { kind: 'laser', spec: specs as unknown as LaserSpec };
    default:
      return { kind: 'none' };
  }
}
