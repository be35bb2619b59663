import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  buildUp,
  cavityLinewidth,
  cavityPole,
  coefficientOfFinesse,
  fieldDecayTime,
  finesse,
  finesseFromMirrorLosses,
  finesseFwhm,
  finesseLowLoss,
  freeSpectralRange,
  lossBudgetLowLoss,
  lossFromRingdown,
  qualityFactor,
  requiredReflectivity,
  resonantTransmission,
  storageTime,
} from '../../../src/lib/fit';
import { expectAbs, expectRel } from './helpers';

const C = 299_792_458;

describe('physics.md A1 check values (Fabry–Perot cavity)', () => {
  test('A1.1 R1 = R2 = 0.9: F_c = 360, ℱ(1.3) = 29.8038, ℱ_FWHM(1.4) = 29.7900, ℱ(1.5) = 31.4159 — textbook exercise (Hecht, Optics 5th ed. 2017 §9.6 form; exercise attributed to Pedrotti, Introduction to Optics [M]); digits [D]', () => {
    expectRel(coefficientOfFinesse({ r1: 0.9, r2: 0.9 }), 360, 1e-4);
    expectRel(finesse({ r1: 0.9, r2: 0.9 }), 29.8038, 1e-4);
    expectRel(finesseFwhm({ r1: 0.9, r2: 0.9 }), 29.79, 1e-4);
    expectRel(finesseLowLoss({ t1: 0.1, t2: 0.1 }), 31.4159, 1e-4);
  });

  test('A1.2 R1 = R2 = 0.98: F_c = 9800, ℱ = 155.501 — same exercise (Pedrotti [M]); [D]', () => {
    expectRel(coefficientOfFinesse({ r1: 0.98, r2: 0.98 }), 9800, 1e-4);
    expectRel(finesse({ r1: 0.98, r2: 0.98 }), 155.501, 1e-4);
  });

  test('A1.3 R1 = R2 = 0.99: ℱ(1.3) = 312.585, ℱ(1.5) = 314.159 — [D] from 1.3 / 1.5', () => {
    expectRel(finesse({ r1: 0.99, r2: 0.99 }), 312.585, 1e-4);
    expectRel(finesseLowLoss({ t1: 0.01, t2: 0.01 }), 314.159, 1e-4);
  });

  test('A1.4 R1 = R2 = 0.5: ℱ(1.3) = 4.44288, ℱ_FWHM(1.4) = 4.34682 — [D]', () => {
    expectRel(finesse({ r1: 0.5, r2: 0.5 }), 4.44288, 1e-4);
    expectRel(finesseFwhm({ r1: 0.5, r2: 0.5 }), 4.34682, 1e-4);
  });

  test('A1.5 supermirror 1.6 ppm per mirror: ℱ(1.5) = 1.963e6, within 5 % of the published 1.9e6; ℱ = 1.9e6 → 1.65 ppm — Rempe et al., Opt. Lett. 17, 363 (1992) [C]', () => {
    expectRel(finesseLowLoss({ t1: 0.8e-6, t2: 0.8e-6, a1: 0.8e-6, a2: 0.8e-6 }), 1.963e6, 1e-3);
    expectRel(finesseLowLoss({ t1: 1.6e-6, t2: 1.6e-6 }), 1.9e6, 0.05);
    const perMirror = lossBudgetLowLoss({ finesse: 1.9e6 }).lossBudget;
    expectRel(perMirror, 1.65e-6, 0.05);
    expectRel(perMirror, 1.6e-6, 0.05);
  });

  test('A1.6 Advanced LIGO arm L = 3994.5 m, T_ITM = 0.014, T_ETM = 5 ppm: ℱ(1.5) = 448.6, ℱ(1.3) = 445.5 (±2 % vs design 450); FSR = 37.5257 kHz; with ℱ = 450 f_p = 41.70 Hz, τ = 1.9086 ms — LIGO T080074 [C]; Aasi et al., Class. Quantum Grav. 32, 074001 (2015) [M]', () => {
    const low = finesseLowLoss({ t1: 0.014, t2: 5e-6 });
    const std = finesse({ r1: 1 - 0.014, r2: 1 - 5e-6 });
    expectRel(low, 448.6, 1e-4);
    expectRel(std, 445.5, 1e-4);
    expectRel(low, 450, 0.02);
    expectRel(std, 450, 0.02);
    expectRel(freeSpectralRange({ lengthM: 3994.5 }), 37525.7, 1e-4);
    // 41.70 Hz is printed to 4 digits (exact 41.6952), coarser than rel 1e-4: check it to its last digit.
    expectAbs(cavityPole({ lengthM: 3994.5, finesse: 450 }), 41.7, 0.005);
    expectRel(storageTime({ lengthM: 3994.5, finesse: 450 }), 1.9086e-3, 1e-4);
  });

  test('A1.7 L = 0.1 m, R = 0.9999, 1064 nm: FSR = 1.498962 GHz, ℱ = 31 414.4, Δν = 47.716 kHz, τ = 3.33547 µs, τ_field = 6.6709 µs, Q = 5.90495e9 — [D] from forms 1.3, 1.6–1.9', () => {
    const f = finesse({ r1: 0.9999, r2: 0.9999 });
    expectRel(freeSpectralRange({ lengthM: 0.1 }), 1.498962e9, 1e-4);
    expectRel(f, 31414.4, 1e-4);
    const dv = cavityLinewidth({ lengthM: 0.1, finesse: f });
    expectRel(dv, 47.716e3, 1e-4);
    expectRel(storageTime({ lengthM: 0.1, finesse: f }), 3.33547e-6, 1e-4);
    expectRel(fieldDecayTime({ lengthM: 0.1, finesse: f }), 6.6709e-6, 1e-4);
    expectRel(qualityFactor({ wavelengthM: 1064e-9, linewidthHz: dv }), 5.90495e9, 1e-4);
  });

  test('A1.7 storage-time conventions 1.8, 1.8a, 1.8b agree (< 1e-8 relative at R = 0.9999) — physics.md A1 note; Saleh & Teich, Fundamentals of Photonics 2nd ed. (2007) ch. 10 [M]', () => {
    const L = 0.1;
    const R = 0.9999;
    const tau = storageTime({ lengthM: L, finesse: finesse({ r1: R, r2: R }) });
    const exact = -(2 * L) / C / Math.log(R * R);
    const symmetric = L / (C * (1 - R));
    expectRel(tau, exact, 1e-8);
    expectRel(tau, symmetric, 1e-4);
  });

  test('A1.8 ring-down L = 0.1 m, τ = 10 µs: per-mirror 33.356 ppm, round-trip 66.71 ppm, ℱ = 94 183 — [D] form 1.10', () => {
    const r = lossFromRingdown({ lengthM: 0.1, tauS: 10e-6 });
    expectRel(r.perMirrorLoss, 33.356e-6, 1e-4);
    expectRel(r.roundTripLoss, 66.71e-6, 1e-4);
    expectRel(r.finesse, 94183, 1e-4);
  });

  test('A1.9 inverse, symmetric, ℱ = 1e4: 1 − R = 3.14110e-4 (1.11a gives π/ℱ = 3.14159e-4) — [D] form 1.11', () => {
    const r = requiredReflectivity({ finesse: 1e4 });
    expect(r.feasible).toBe(true);
    expectRel(r.lossBudget, 3.1411e-4, 1e-4);
    expectRel(lossBudgetLowLoss({ finesse: 1e4 }).lossBudget, 3.14159e-4, 1e-4);
  });

  test('A1.10 inverse, ℱ = 2e4 with R1 = 0.9999: T2,max = 1 − R2 = 2.14131e-4 — [D] form 1.11', () => {
    const r = requiredReflectivity({ finesse: 2e4, r1: 0.9999 });
    expect(r.feasible).toBe(true);
    expectRel(r.lossBudget, 2.14131e-4, 1e-4);
  });

  test('A1.11 T1 = T2 = 100 ppm, L_rt = 50 ppm: T_res = 0.64000, build-up 6400.2 — [D] forms 1.12, 1.13', () => {
    expectRel(resonantTransmission({ t1: 1e-4, t2: 1e-4, extraLoss: 5e-5 }), 0.64, 1e-4);
    expectRel(buildUp({ t1: 1e-4, t2: 1e-4, extraLoss: 5e-5 }), 6400.2, 1e-4);
  });

  test('A1.12 asymmetric R1 = 0.99, R2 = 0.999: ℱ(1.3) = ℱ_FWHM = 568.570, ℱ(1.5) = 571.199 — [D]', () => {
    expectRel(finesse({ r1: 0.99, r2: 0.999 }), 568.57, 1e-4);
    expectRel(finesseFwhm({ r1: 0.99, r2: 0.999 }), 568.57, 1e-4);
    expectRel(finesseLowLoss({ t1: 0.01, t2: 0.001 }), 571.199, 1e-4);
  });

  test('A1.13 R = 0.9999 with L_rt = 50 ppm: ℱ(1.3) = 25 131.6, ℱ(1.5) = 25 132.7 — [D]', () => {
    expectRel(finesse({ r1: 0.9999, r2: 0.9999, extraLoss: 50e-6 }), 25131.6, 1e-4);
    expectRel(finesseLowLoss({ t1: 1e-4, t2: 1e-4, extraLoss: 50e-6 }), 25132.7, 1e-4);
    expectRel(finesseFromMirrorLosses({ loss1: 1e-4, loss2: 1e-4, extraLoss: 50e-6 }), 25131.6, 1e-4);
  });

  test('A1.14 monolithic L = 10 mm, n_g = 1.5, R = 0.995, 1550 nm: FSR = 9.99308 GHz, ℱ = 626.746, Δν = 15.944 MHz, τ = 9.9819 ns, Q = 1.21306e7 — [D]', () => {
    const geometry = { lengthM: 0.01, groupIndex: 1.5 };
    const f = finesse({ r1: 0.995, r2: 0.995 });
    expectRel(freeSpectralRange(geometry), 9.99308e9, 1e-4);
    expectRel(f, 626.746, 1e-4);
    const dv = cavityLinewidth({ ...geometry, finesse: f });
    expectRel(dv, 15.944e6, 1e-4);
    expectRel(storageTime({ ...geometry, finesse: f }), 9.9819e-9, 1e-4);
    expectRel(qualityFactor({ wavelengthM: 1550e-9, linewidthHz: dv }), 1.21306e7, 1e-4);
  });

  test('A1.15 inverse ℱ = 5000 with R1 = 0.999: 1 − R2 = 2.56104e-4 (low-loss form 2.56637e-4) — [D]', () => {
    expectRel(requiredReflectivity({ finesse: 5000, r1: 0.999 }).lossBudget, 2.56104e-4, 1e-4);
    expectRel(lossBudgetLowLoss({ finesse: 5000, loss1: 0.001 }).lossBudget, 2.56637e-4, 1e-4);
  });

  test('A1 validity note: forms 1.3 and 1.4 differ by 2.2 % at R = 0.5, 0.05 % at R = 0.9, < 1e-6 above ℱ ≈ 1000 — physics.md A1 [D]', () => {
    const diff = (r: number) => finesse({ r1: r, r2: r }) / finesseFwhm({ r1: r, r2: r }) - 1;
    expectRel(diff(0.5), 0.022, 0.02);
    expectRel(diff(0.9), 0.00046, 0.1);
    expect(Math.abs(diff(0.997))).toBeLessThan(1e-6);
  });
});

describe('cavity properties (fast-check)', () => {
  const refl = fc.double({ min: 0.01, max: 0.999999, noNaN: true });

  test('finesse rises with reflectivity', () => {
    fc.assert(
      fc.property(refl, refl, refl, (a, b, r2) => {
        fc.pre(Math.abs(a - b) > 1e-9);
        const [lo, hi] = a < b ? [a, b] : [b, a];
        expect(finesse({ r1: hi, r2 })).toBeGreaterThan(finesse({ r1: lo, r2 }));
      }),
    );
  });

  test('requiredReflectivity inverts finesse (symmetric and with a known mirror)', () => {
    fc.assert(
      fc.property(refl, refl, fc.double({ min: 0, max: 1e-3, noNaN: true }), (r, r1, extraLoss) => {
        const symmetric = finesse({ r1: r, r2: r, extraLoss });
        const back = requiredReflectivity({ finesse: symmetric, extraLoss });
        expect(back.feasible).toBe(true);
        expect(Math.abs(back.reflectivity - r)).toBeLessThan(1e-9);
        const f = finesse({ r1, r2: r, extraLoss });
        const other = requiredReflectivity({ finesse: f, r1, extraLoss });
        expect(Math.abs(other.reflectivity - r)).toBeLessThan(1e-8);
      }),
    );
  });

  test('finesseFromMirrorLosses agrees with finesse(1 − loss)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-7, max: 0.5, noNaN: true }), fc.double({ min: 1e-7, max: 0.5, noNaN: true }), (l1, l2) => {
        expectRel(finesseFromMirrorLosses({ loss1: l1, loss2: l2 }), finesse({ r1: 1 - l1, r2: 1 - l2 }), 1e-8);
      }),
    );
  });
});

describe('cavity edge cases', () => {
  test('reflectivity outside [0, 1) throws FitInputError naming the field', () => {
    for (const r1 of [1, 1.2, -0.1, Number.NaN, Infinity]) {
      expect(() => finesse({ r1, r2: 0.9 })).toThrow(FitInputError);
    }
    try {
      finesse({ r1: 0.9, r2: 1 });
    } catch (e) {
      expect(e).toBeInstanceOf(FitInputError);
      expect((e as FitInputError).field).toBe('r2');
      expect((e as FitInputError).message).toMatch(/\[0, 1\)/);
    }
  });

  test('negative or zero length throws', () => {
    expect(() => freeSpectralRange({ lengthM: -1 })).toThrow(FitInputError);
    expect(() => freeSpectralRange({ lengthM: 0 })).toThrow(/lengthM/);
  });

  test('a length so short the FSR overflows throws rather than returning Infinity', () => {
    expect(() => freeSpectralRange({ lengthM: 1e-320 })).toThrow(FitInputError);
  });

  test('lossless cavity: low-loss finesse and transmission refuse rather than divide by zero', () => {
    expect(() => finesseLowLoss({ t1: 0, t2: 0 })).toThrow(FitInputError);
    expect(() => resonantTransmission({ t1: 0, t2: 0 })).toThrow(FitInputError);
    expect(() => finesseFromMirrorLosses({ loss1: 0, loss2: 0 })).toThrow(FitInputError);
  });

  test('FWHM finesse is undefined below ρ ≈ 0.0294: throws', () => {
    expect(() => finesseFwhm({ r1: 0.1, r2: 0.1 })).toThrow(FitInputError);
    expect(finesseFwhm({ r1: 0.2, r2: 0.2 })).toBeGreaterThan(0);
  });

  test('requiredReflectivity flags an impossible target instead of returning R ≥ 1', () => {
    const r = requiredReflectivity({ finesse: 1e5, r1: 0.999 });
    expect(r.feasible).toBe(false);
    expect(r.reason).toMatch(/mirror 1/);
    expect(r.lossBudget).toBeLessThanOrEqual(0);
    const lossy = requiredReflectivity({ finesse: 1e6, extraLoss: 1e-4 });
    expect(lossy.feasible).toBe(false);
  });

  test('ring-down shorter than the round trip is rejected', () => {
    expect(() => lossFromRingdown({ lengthM: 1, tauS: 1e-9 })).toThrow(/tauS/);
  });
});
