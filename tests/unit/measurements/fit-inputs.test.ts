import { describe, expect, test } from 'vitest';
import { evaluateCavityGoal, evaluateSqueezingGoal, type CavityGoal } from '../../../src/lib/fit';
import {
  curveOf,
  interpolateAt,
  parseMeasurementCsv,
  toEfficiencyCurve,
  toMirrorSpectrum,
  toQeCurve,
  toRingdownMeasurement,
  type EfficiencyCurveData,
  type MeasurementData,
  type RingdownData,
} from '../../../src/lib/measurements';
import { expectRel } from '../fit/helpers';
import { MIRROR_SPECS, PHOTODIODE_SPECS } from '../specs/fixtures';
import { ringdownCsv } from './synthetic';

function parsed(kind: 'spectrum' | 'ringdown' | 'efficiency-curve', text: string): MeasurementData {
  const r = parseMeasurementCsv(kind, text);
  if (!r.ok) throw new Error(r.error.message);
  return r.data;
}

const SPECTRUM = parsed(
  'spectrum',
  ['wavelength_nm,transmission_ppm,loss_ppm', '770,4,6', '775,3,5', '780,2,4', '785,3,5', '790,4,6'].join('\n'),
);
const GOAL: CavityGoal = { wavelengthNm: 777.5, lengthM: 0.05, target: { kind: 'finesse', value: 1e5 }, configuration: 'pair' };

describe('interpolateAt (physics.md A12 form 12.6: linear between measured points, no value outside)', () => {
  const points =
    SPECTRUM.kind === 'spectrum' && SPECTRUM.quantity !== 'reflectance' ? curveOf(SPECTRUM.points, 'wavelengthNm', 'transmissionPpm') : [];
  test('linear inside, exact at the measured points', () => {
    expect(interpolateAt(points, 777.5)).toBeCloseTo(2.5, 12);
    expect(interpolateAt(points, 770)).toBe(4);
    expect(interpolateAt(points, 790)).toBe(4);
  });
  test('null outside the measured range, never extrapolated', () => {
    expect(interpolateAt(points, 769.999)).toBeNull();
    expect(interpolateAt(points, 800)).toBeNull();
    expect(interpolateAt([], 780)).toBeNull();
  });
});

describe('measured data as fit-engine input', () => {
  test('a transmission + loss spectrum replaces the spec where it covers the buyer wavelength (product.md goal semantics)', () => {
    const spectrum = toMirrorSpectrum(SPECTRUM);
    expect(spectrum).not.toBeNull();
    const r = evaluateCavityGoal(GOAL, { ...MIRROR_SPECS, spectrum: spectrum! });
    expect(r.mirrors[0]?.source).toBe('spectrum');
    expect(r.mirrors[0]?.transmissionPpm).toBeCloseTo(2.5, 12);
    expect(r.mirrors[0]?.lossPpm).toBeCloseTo(4.5, 12);
  });

  test('a reflectance-only spectrum gives no fit input', () => {
    const refl = parsed('spectrum', ['wavelength_nm,R (%)', '770,99.99', '775,99.99', '780,99.99', '785,99.99', '790,99.99'].join('\n'));
    expect(toMirrorSpectrum(refl)).toBeNull();
  });

  test('a ring-down with its length replaces T + loss at its wavelength: τ ≈ 10 µs in 0.1 m → 33.4 ppm per mirror (physics.md A1.8)', () => {
    const data = parsed('ringdown', ringdownCsv({ tauS: 10e-6, seed: 11, comments: ['# length_m=0.1'] })) as RingdownData;
    const ringdown = toRingdownMeasurement(data, { wavelengthNm: MIRROR_SPECS.designWavelengthNm });
    expect(ringdown).toEqual({ wavelengthNm: 780, lengthM: 0.1, tauS: data.fit.tauS });
    const r = evaluateCavityGoal({ ...GOAL, wavelengthNm: 780 }, { ...MIRROR_SPECS, ringdown: ringdown! });
    expect(r.mirrors[0]?.source).toBe('ring-down');
    expectRel(r.mirrors[0]?.totalPpm, 33.356, 0.01);
  });

  test('a ring-down without a length uses the one the listing gives, else none', () => {
    const data = parsed('ringdown', ringdownCsv({ tauS: 10e-6, seed: 11 })) as RingdownData;
    expect(toRingdownMeasurement(data, { wavelengthNm: 780 })).toBeNull();
    expect(toRingdownMeasurement(data, { wavelengthNm: 780, lengthM: 0.05 })?.lengthM).toBe(0.05);
  });

  test('a QE curve feeds the squeezing evaluator; an efficiency curve keeps its field names', () => {
    const curve = parsed(
      'efficiency-curve',
      ['wavelength_nm,qe_pct', '1500,90', '1525,92', '1550,94', '1575,92', '1600,90'].join('\n'),
    ) as EfficiencyCurveData;
    const { quantumEfficiency: _omitted, ...rest } = PHOTODIODE_SPECS;
    const r = evaluateSqueezingGoal(
      {
        wavelengthNm: 1537.5,
        targetDb: 3,
        sidebandHz: 1e6,
        source: { kind: 'initial', initialDb: 10 },
        escapeEfficiency: 0.98,
        propagationEfficiency: 0.98,
        visibility: 0.99,
        loPowerW: 5e-3,
      },
      { ...rest, qeCurve: toQeCurve(curve) },
    );
    expect(r.qeSource).toBe('curve');
    expect(r.quantumEfficiency?.nominal).toBeCloseTo(0.93, 12);
    expect(toEfficiencyCurve(curve)[2]).toEqual({ wavelengthNm: 1550, efficiency: 0.94 });
  });
});
