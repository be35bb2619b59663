import { describe, expect, test } from 'vitest';
import { fitRingdown, parseMeasurementCsv, ringdownFigures, type RingdownData } from '../../../src/lib/measurements';
import { expectRel } from '../fit/helpers';
import { gaussian, mulberry32, ringdownCsv, type TraceOptions } from './synthetic';

function ringdown(o: TraceOptions): RingdownData {
  const r = parseMeasurementCsv('ringdown', ringdownCsv(o));
  if (!r.ok) throw new Error(`line ${r.error.line}: ${r.error.message}`);
  if (r.data.kind !== 'ringdown') throw new Error('not a ring-down');
  return r.data;
}

// The fit reports the standard (1σ) uncertainty u(τ) from s²·(JᵀJ)⁻¹. The listing shows the
// expanded uncertainty U = 2u (coverage factor k = 2, about 95 % for Gaussian noise; JCGM 100:2008
// GUM §6.2–6.3), so each trace is checked against ±2σ: at ±1σ about a third of honest fits would miss.
// That u itself is right, neither too small nor padded, is checked on its own by the coverage rates below.
describe('ring-down fit of synthetic traces with 1 % Gaussian noise (common practice; model I = A·exp(−t/τ) + B, physics.md A1 form 1.8)', () => {
  const cases: [number, TraceOptions['timeUnit'], number][] = [];
  const taus = [
    [2e-6, 'ns'],
    [10e-6, 'us'],
    [250e-6, 'us'],
    [3.3e-3, 'ms'],
  ] as const;
  // Different seeds per τ: the fit is scale-free, so equal seeds would repeat one noise draw.
  taus.forEach(([tau, unit], k) => {
    for (const seed of [1, 2, 3]) cases.push([tau, unit, 10 * k + seed]);
  });

  test.each(cases)('τ = %d s (times in %s), seed %d: within 1 % and within ±2σ', (tauS, timeUnit, seed) => {
    const { fit } = ringdown({ tauS, seed, timeUnit });
    expect(Math.abs(fit.tauS - tauS) / tauS).toBeLessThan(0.01);
    expect(Math.abs(fit.tauS - tauS)).toBeLessThanOrEqual(2 * fit.tauUncertaintyS);
    expect(fit.tauUncertaintyS / tauS).toBeGreaterThan(0);
    expectRel(fit.offset, 0.02, 0.05);
    expectRel(fit.residualRms, 0.01, 0.1);
  });

  test('the 1σ uncertainty is calibrated: over 200 noise draws about 68 % of fits fall within ±1σ and about 95 % within ±2σ', () => {
    let in1 = 0;
    let in2 = 0;
    const runs = 200;
    for (let seed = 100; seed < 100 + runs; seed++) {
      const { fit } = ringdown({ tauS: 10e-6, seed, points: 500 });
      const z = Math.abs(fit.tauS - 10e-6) / fit.tauUncertaintyS;
      if (z <= 1) in1++;
      if (z <= 2) in2++;
    }
    // Binomial spread for 200 draws is ±3.3 % at 68 %: these bounds are about ±3 sd.
    expect(in1 / runs).toBeGreaterThan(0.58);
    expect(in1 / runs).toBeLessThan(0.78);
    expect(in2 / runs).toBeGreaterThan(0.9);
  });

  test('more noise gives a proportionally larger uncertainty (σ_τ ∝ σ_noise for least squares)', () => {
    const quiet = ringdown({ tauS: 10e-6, seed: 5, noise: 0.005 }).fit;
    const loud = ringdown({ tauS: 10e-6, seed: 5, noise: 0.02 }).fit;
    expectRel(loud.tauUncertaintyS / quiet.tauUncertaintyS, 4, 0.15);
  });

  test('a trace with a pre-trigger plateau is fitted from the switch-off on', () => {
    const { fit } = ringdown({ tauS: 10e-6, seed: 9, preTriggerTaus: 2 });
    expect(Math.abs(fit.tauS - 10e-6) / 10e-6).toBeLessThan(0.01);
    expect(fit.fitStartS).toBeGreaterThanOrEqual(0);
    expect(fit.fitStartS).toBeLessThan(0.2 * 10e-6);
  });

  test('a long trace (150 000 samples) is fitted quickly and accurately', () => {
    const started = performance.now();
    const { fit } = ringdown({ tauS: 10e-6, seed: 4, points: 150_000 });
    expect(performance.now() - started).toBeLessThan(5000);
    expect(Math.abs(fit.tauS - 10e-6) / 10e-6).toBeLessThan(0.001);
    expect(Math.abs(fit.tauS - 10e-6)).toBeLessThanOrEqual(2 * fit.tauUncertaintyS);
  });

  test('the plot curve samples the fitted model over the fitted span', () => {
    const { fit, points } = ringdown({ tauS: 10e-6, seed: 1 });
    expect(fit.curve).toHaveLength(200);
    expect(fit.curve[0]?.timeS).toBe(fit.fitStartS);
    expect(fit.curve[199]?.timeS).toBeCloseTo(points[points.length - 1]!.timeS, 12);
    expectRel(fit.curve[0]?.intensity, fit.amplitude + fit.offset, 1e-12);
  });

  test('fitRingdown works on points directly', () => {
    const normal = gaussian(mulberry32(3));
    const points = Array.from({ length: 1000 }, (_, i) => ({
      timeS: i * 1e-8,
      intensity: 5 * Math.exp(-(i * 1e-8) / 1e-6) + 0.05 * normal(),
    }));
    const fit = fitRingdown(points);
    expect(Math.abs(fit.tauS - 1e-6)).toBeLessThanOrEqual(2 * fit.tauUncertaintyS);
    expect(fit.pointsFitted).toBeGreaterThan(900);
  });
});

describe('loss and finesse from τ (physics.md A1 form 1.10)', () => {
  test('A1.8: L = 0.1 m, τ = 10 µs → per-mirror 33.356 ppm, round trip 66.71 ppm, ℱ = 94 183; the relative uncertainty of τ carries over', () => {
    const f = ringdownFigures({ tauS: 10e-6, tauUncertaintyS: 0.1e-6 }, 0.1);
    expectRel(f.perMirrorLoss.value, 33.356e-6, 1e-4);
    expectRel(f.roundTripLoss.value, 66.71e-6, 1e-4);
    expectRel(f.finesse.value, 94_183, 1e-4);
    expectRel(f.perMirrorLoss.uncertainty, 0.33356e-6, 1e-4);
    expectRel(f.finesse.uncertainty, 941.83, 1e-4);
    expect(f.groupIndex).toBe(1);
  });

  test('a group index scales the loss: 1 − R = n_g·L/(c·τ)', () => {
    const f = ringdownFigures({ tauS: 10e-6, tauUncertaintyS: 0 }, 0.1, 1.5);
    expectRel(f.perMirrorLoss.value, 1.5 * 33.356e-6, 1e-4);
  });

  test('the CSV comment "# length_m=0.1" gives the figures; without it they are null with a note', () => {
    const withLength = ringdown({ tauS: 10e-6, seed: 2, comments: ['# cavity test', '# length_m=0.1, wavelength_nm=780'] });
    expect(withLength.lengthM).toBe(0.1);
    expect(withLength.wavelengthNm).toBe(780);
    expect(Math.abs((withLength.figures?.finesse.value ?? 0) - 94_183) / 94_183).toBeLessThan(0.01);
    const without = ringdown({ tauS: 10e-6, seed: 2 });
    expect(without.figures).toBeNull();
    expect(without.notes.join(' ')).toMatch(/length_m/);
    expect(ringdown({ tauS: 10e-6, seed: 2, comments: ['# length_mm = 50'] }).lengthM).toBe(0.05);
  });
});

describe('ring-down file errors', () => {
  function error(text: string) {
    const r = parseMeasurementCsv('ringdown', text);
    return r.ok ? null : r.error;
  }
  const rows = Array.from({ length: 20 }, (_, i) => `${i},${Math.exp(-i / 4)}`);

  test('times that do not increase name the line and the time column', () => {
    const bad = [...rows];
    bad[7] = `5,0.1`;
    expect(error(['time_us,intensity', ...bad].join('\n'))).toEqual({
      line: 9,
      column: 1,
      message: expect.stringMatching(/increase/) as unknown,
    });
  });
  test('an unknown or missing time unit names the header cell', () => {
    expect(error(['intensity,time (min)', ...rows].join('\n'))).toMatchObject({
      line: 1,
      column: 2,
      message: expect.stringMatching(/Unknown unit "min"/) as unknown,
    });
    expect(error(['time,intensity', ...rows].join('\n'))).toMatchObject({
      line: 1,
      column: 1,
      message: expect.stringMatching(/unit of the time/) as unknown,
    });
  });
  test('a flat trace does not decay', () => {
    const flat = Array.from({ length: 50 }, (_, i) => `${i},${1 + 0.001 * Math.sin(i)}`);
    expect(error(['time_s,signal', ...flat].join('\n'))?.message).toMatch(/decay/);
  });
  test('too few points', () => {
    expect(error(['time_s,intensity', ...rows.slice(0, 6)].join('\n'))?.message).toMatch(/at least 10/);
  });
  test('a decay shorter than the round trip of the stated cavity is refused (form 1.10 needs τ ≫ 2L/c)', () => {
    expect(error(['# length_m=1', 'time_ps,intensity', ...rows].join('\n'))).toMatchObject({
      line: 1,
      message: expect.stringMatching(/round trip/) as unknown,
    });
  });
  test('a bad value for a known comment key names the comment line', () => {
    expect(error(['# note', '# length_m=-2', 'time_us,intensity', ...rows].join('\n'))).toMatchObject({ line: 2, column: null });
  });
});
