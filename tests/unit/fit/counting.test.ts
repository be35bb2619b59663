import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  accidentalRate,
  bellThresholds,
  chEberhardJ,
  coincidenceToAccidental,
  combinedJitter,
  deadTimeRate,
  erf,
  heraldingEfficiency,
  maxMeasuredRate,
  trueRateFromMeasured,
  windowCapture,
} from '../../../src/lib/fit';
import { expectAbs, expectRel } from './helpers';

describe('physics.md A6 check values (photon counting)', () => {
  test('A6.1 thresholds 2/(1 + √2) = 0.828427 and 2/3 = 0.666667 — Garg & Mermin, "Detector inefficiencies in the Einstein-Podolsky-Rosen experiment", PRD 35, 3831 (1987) [M]; Eberhard, PRA 47, R747 (1993) [M]; [D]', () => {
    const t = bellThresholds();
    expectRel(t.chsh, 0.828427, 1e-6);
    expectRel(t.chsh, 2 * (Math.SQRT2 - 1), 1e-15);
    expectRel(t.eberhard, 0.666667, 1e-6);
  });

  test('A6.2 R = 1e6 /s, τ_d = 50 ns: non-paralyzable 952 381 /s (4.76 % lost), paralyzable 951 229 /s — [D] forms 6.7, 6.8; Knoll, Radiation Detection and Measurement 4th ed. (2010) ch. 4 [M]', () => {
    const np = deadTimeRate({ trueRate: 1e6, deadTimeS: 50e-9, model: 'non-paralyzable' });
    expectRel(np, 952381, 1e-5);
    expectRel(1 - np / 1e6, 0.0476, 1e-3);
    expectRel(deadTimeRate({ trueRate: 1e6, deadTimeS: 50e-9, model: 'paralyzable' }), 951229, 1e-5);
  });

  test('A6.3 measured 4e6 /s, τ_d = 100 ns, non-paralyzable: true 6.6667e6 /s — [D] form 6.7', () => {
    expectRel(trueRateFromMeasured({ measuredRate: 4e6, deadTimeS: 100e-9 }), 6.6667e6, 1e-5);
  });

  test('A6.4 N1 = N2 = 1e5 /s, τ_c = 1 ns full width, C = 5000 /s: A = 10 /s, CAR = 499 (C/A = 500) — [D] forms 6.5, 6.6', () => {
    const a = accidentalRate({ rate1: 1e5, rate2: 1e5, windowS: 1e-9 });
    expectRel(a, 10, 1e-6);
    const car = coincidenceToAccidental({ coincidences: 5000, accidentals: a });
    expectRel(car, 499, 1e-6);
    expectRel(car + 1, 500, 1e-6);
  });

  test('A6.5 N_s = 1e5, N_i = 1.2e5, C = 2.5e4 /s, A = D = 0: η_s = 0.208333, η_i = 0.250000 — Klyshko, Sov. J. Quantum Electron. 10, 1112 (1980) [M]; [D] form 6.4', () => {
    // 0.208333 is printed to 6 digits (exact 0.2083333…), coarser than rel 1e-6: check it to its last digit.
    expectAbs(heraldingEfficiency({ coincidences: 2.5e4, singlesHerald: 1.2e5 }), 0.208333, 5e-7);
    expectRel(heraldingEfficiency({ coincidences: 2.5e4, accidentals: 0, singlesHerald: 1e5, darkHerald: 0 }), 0.25, 1e-6);
  });

  test('A6.6 jitter 50 ps ⊕ 20 ps = 53.852 ps; W = 100 ps with 50 ps FWHM keeps 98.147 % — [D] form 6.9', () => {
    expectRel(combinedJitter([50e-12, 20e-12]), 53.852e-12, 1e-4);
    expectRel(windowCapture({ windowS: 100e-12, jitterFwhmS: 50e-12 }), 0.98147, 1e-4);
  });

  test('A6.7 Giustina et al. 2015 counts: J = +7.268e-6 (> 0, violation), raw sum +6 364 — M. Giustina et al., "Significant-loophole-free test of Bell\'s theorem with entangled photons", PRL 115, 250401 (2015) [C, secondary quote]; [D]', () => {
    const r = chEberhardJ({
      trials: { a1b1: 875_683_790, a1b2: 875_518_074, a2b1: 875_882_007, a2b2: 875_700_279 },
      coincidencesA1B1: 141_439,
      aliceOnlyA1B2: 67_941,
      bobOnlyA2B1: 58_742,
      coincidencesA2B2: 8_392,
    });
    expectRel(r.j, 7.268e-6, 1e-3);
    expect(r.violation).toBe(true);
    expect(r.rawCountSum).toBe(6364);
  });

  test('A6.8 R = 3e7 /s, τ_d = 20 ns: non-paralyzable 1.87500e7, paralyzable 1.64643e7 /s — [D]', () => {
    expectRel(deadTimeRate({ trueRate: 3e7, deadTimeS: 20e-9, model: 'non-paralyzable' }), 1.875e7, 1e-5);
    expectRel(deadTimeRate({ trueRate: 3e7, deadTimeS: 20e-9, model: 'paralyzable' }), 1.64643e7, 1e-5);
  });

  test('A6.9 paralyzable τ_d = 50 ns: maximum 7.35759e6 /s at R = 2e7 /s — [D] form 6.8', () => {
    const m = maxMeasuredRate({ deadTimeS: 50e-9, model: 'paralyzable' });
    expectRel(m.maxRate, 7.35759e6, 1e-5);
    expectRel(m.atTrueRate, 2e7, 1e-5);
    expectRel(deadTimeRate({ trueRate: 2e7, deadTimeS: 50e-9, model: 'paralyzable' }), m.maxRate, 1e-12);
  });
});

describe('counting edges', () => {
  test('erf matches known values (Abramowitz & Stegun, Handbook of Mathematical Functions (1964), table 7.1 [M])', () => {
    expectRel(erf(0.5), 0.5204998778, 1e-9);
    expectRel(erf(1), 0.8427007929, 1e-9);
    expectRel(erf(2), 0.995322265, 1e-9);
    expect(erf(-1)).toBeCloseTo(-0.8427007929, 9);
    expect(erf(0)).toBe(0);
    expect(erf(10)).toBe(1);
  });

  test('a measured rate at or above 1/τ_d has no non-paralyzable true rate', () => {
    expect(() => trueRateFromMeasured({ measuredRate: 1e7, deadTimeS: 100e-9 })).toThrow(FitInputError);
  });

  test('non-paralyzable saturation 1/τ_d is never reached', () => {
    expect(maxMeasuredRate({ deadTimeS: 50e-9, model: 'non-paralyzable' })).toEqual({ maxRate: 2e7, atTrueRate: null });
  });

  test('CAR with zero accidentals and heralding with no herald counts refuse instead of returning Infinity', () => {
    expect(() => coincidenceToAccidental({ coincidences: 10, accidentals: 0 })).toThrow(/accidentals/);
    expect(() => heraldingEfficiency({ coincidences: 10, singlesHerald: 5, darkHerald: 5 })).toThrow(/singlesHerald/);
  });

  test('jitter: empty list throws; zero jitter captures everything', () => {
    expect(() => combinedJitter([])).toThrow(FitInputError);
    expect(windowCapture({ windowS: 1e-9, jitterFwhmS: 0 })).toBe(1);
  });

  test('unknown dead-time model throws', () => {
    expect(() => deadTimeRate({ trueRate: 1, deadTimeS: 1e-9, model: 'other' as 'paralyzable' })).toThrow(/model/);
  });
});
