/**
 * A listing's stored specs plus its parsed measurement files, as the fit engine's input for its
 * category: a measured spectrum, ring-down or efficiency curve is attached where the engine uses it.
 */
import type { LaserSpec, MirrorSpec, PhotodiodeSpec, SinglePhotonDetectorSpec } from '../fit';
import { toEfficiencyCurve, toMirrorSpectrum, toQeCurve, toRingdownMeasurement } from '../measurements';
import type { EfficiencyCurveData, MeasurementData } from '../measurements/types';
import type { Category } from './constants';

export type FitCandidate =
  | { kind: 'mirror'; spec: MirrorSpec }
  | { kind: 'photodiode'; spec: PhotodiodeSpec }
  | { kind: 'counter'; spec: SinglePhotonDetectorSpec }
  | { kind: 'laser'; spec: LaserSpec }
  | { kind: 'none' };

const curveOf = (ms: readonly MeasurementData[]) => ms.find((m): m is EfficiencyCurveData => m.kind === 'efficiency-curve');

export function fitCandidate(
  category: Category,
  specs: Record<string, unknown>,
  measurements: readonly MeasurementData[] = [],
): FitCandidate {
  switch (category) {
    case 'cavity-mirror': {
      const spec = { ...(specs as unknown as MirrorSpec) };
      for (const m of measurements) {
        spec.spectrum ??= toMirrorSpectrum(m) ?? undefined;
        if (m.kind === 'ringdown') spec.ringdown ??= toRingdownMeasurement(m, { wavelengthNm: spec.designWavelengthNm }) ?? undefined;
      }
      return { kind: 'mirror', spec };
    }
    case 'photodiode':
    case 'balanced-detector': {
      const spec = { ...(specs as unknown as PhotodiodeSpec) };
      const curve = curveOf(measurements);
      if (curve) spec.qeCurve ??= toQeCurve(curve);
      return { kind: 'photodiode', spec };
    }
    case 'single-photon-detector': {
      const spec = { ...(specs as unknown as SinglePhotonDetectorSpec) };
      const curve = curveOf(measurements);
      if (curve) spec.efficiencyCurve ??= toEfficiencyCurve(curve);
      return { kind: 'counter', spec };
    }
    case 'laser':
      return { kind: 'laser', spec: specs as unknown as LaserSpec };
    default:
      return { kind: 'none' };
  }
}
