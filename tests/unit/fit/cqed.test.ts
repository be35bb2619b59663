import { describe, expect, test } from 'vitest';
import { cooperativity, cqed, cqedFromRates, FitInputError, freeSpectralRange } from '../../../src/lib/fit';
import { expectAbs, expectRel } from './helpers';

describe('physics.md A4 check values (cavity QED; Kimble, Phys. Scr. T76, 127 (1998) [M]; Tanji-Suzuki et al., Adv. At. Mol. Opt. Phys. 60, 201 (2011))', () => {
  test('A4.1 ℱ = 1e5, λ = 780 nm, w0 = 50 µm: η = 4.7092, C1 = 2.3546 — [D] forms 4.4/4.5', () => {
    const c = cooperativity({ finesse: 1e5, wavelengthM: 780e-9, waistM: 50e-6 });
    expectRel(c.eta, 4.7092, 1e-4);
    expectRel(c.c1, 2.3546, 1e-4);
  });

  test('A4.2 published (g0, κ, γ⊥)/2π = (34, 4.1, 2.6) MHz: C1 = 54.22, n0 = 2.92e-3, N0 = 1.84e-2, g0/max(κ, γ) = 8.3, strong coupling — Boca et al., PRL 93, 233603 (2004); Birnbaum et al., Nature 436, 87 (2005) [C paper; rates M]', () => {
    const r = cqedFromRates({ g0Hz: 34e6, kappaHz: 4.1e6, gammaHz: 2.6e6 });
    expectRel(r.c1, 54.22, 1e-3);
    // n0 and N0 are printed to 3 digits (exact 2.9239e-3, 1.8443e-2), coarser than rel 1e-3: check them to their last digit.
    expectAbs(r.n0, 2.92e-3, 0.005e-3);
    expectAbs(r.N0, 1.84e-2, 0.005e-2);
    expectRel(r.couplingRatio, 8.3, 1e-2);
    expect(r.strongCoupling).toBe(true);
  });

  test('A4.3 Rb D2 (780.241 nm, Γ/2π = 6.0666 MHz), L = 1 mm, w0 = 20 µm, ℱ = 1e5: g0/2π = 8.1825 MHz, κ/2π = 0.74948 MHz, γ/2π = 3.0333 MHz, C1 = 14.725, η = 29.451 — [D] forms 4.3–4.5; atomic data Steck, "Rubidium 87 D Line Data" [M]', () => {
    const q = cqed({ wavelengthM: 780.241e-9, gammaHz: 6.0666e6, lengthM: 1e-3, waistM: 20e-6, finesse: 1e5 });
    expectRel(q.g0Hz, 8.1825e6, 1e-4);
    expectRel(q.kappaHz, 0.74948e6, 1e-4);
    expectRel(q.gammaHz, 3.0333e6, 1e-4);
    expectRel(q.c1, 14.725, 1e-4);
    expectRel(q.eta, 29.451, 1e-4);
    expectRel(cooperativity({ finesse: 1e5, wavelengthM: 780.241e-9, waistM: 20e-6 }).c1, q.c1, 1e-9);
  });

  test('A4.4 Cs D2, L = 42.2 µm, w0 = 23.4 µm: g0/2π = 34.54 MHz (±3 % vs published 34); κ/2π = 4.1 MHz implies ℱ = 4.33e5 — w0 [M]; [D]; Steck, "Cesium D Line Data" [M]', () => {
    const q = cqed({ wavelengthM: 852.347e-9, gammaHz: 5.234e6, lengthM: 42.2e-6, waistM: 23.4e-6, finesse: 4.33e5 });
    expectRel(q.g0Hz, 34.54e6, 1e-3);
    expectRel(q.g0Hz, 34e6, 0.03);
    expectRel(freeSpectralRange({ lengthM: 42.2e-6 }) / (2 * 4.1e6), 4.33e5, 0.03);
    expectRel(q.kappaHz, 4.1e6, 0.03);
  });

  test('A4.5 ℱ = 2e5, λ = 1064 nm, w0 = 30 µm: η = 48.682, C1 = 24.341 — [D]', () => {
    const c = cooperativity({ finesse: 2e5, wavelengthM: 1064e-9, waistM: 30e-6 });
    expectRel(c.eta, 48.682, 1e-4);
    expectRel(c.c1, 24.341, 1e-4);
  });

  test('A4.6 Cs D2 (852.347 nm, 5.234 MHz), L = 10 mm, w0 = 50 µm, ℱ = 3e5: g0/2π = 1.0502 MHz, κ/2π = 24.98 kHz, γ/2π = 2.617 MHz, C1 = 8.435, η = 16.870; not strong coupling (g0 < γ) though C1 > 1 — [D]', () => {
    const q = cqed({ wavelengthM: 852.347e-9, gammaHz: 5.234e6, lengthM: 10e-3, waistM: 50e-6, finesse: 3e5 });
    expectRel(q.g0Hz, 1.0502e6, 1e-3);
    expectRel(q.kappaHz, 24.98e3, 1e-3);
    expectRel(q.gammaHz, 2.617e6, 1e-3);
    expectRel(q.c1, 8.435, 1e-3);
    expectRel(q.eta, 16.87, 1e-3);
    expect(q.strongCoupling).toBe(false);
    expect(q.c1).toBeGreaterThan(1);
  });

  test('A4 conventions: η = 2·C1, N0 = 1/C1, β = η/(1 + η) — physics.md forms 4.5–4.7 [D]', () => {
    const q = cqed({ wavelengthM: 780e-9, gammaHz: 6e6, lengthM: 1e-3, waistM: 30e-6, finesse: 5e4 });
    expectRel(q.eta, 2 * q.c1, 1e-12);
    expectRel(q.N0, 1 / q.c1, 1e-12);
    expectRel(q.beta, q.eta / (1 + q.eta), 1e-12);
  });

  test('a C1 within a factor 2 of the largest double is refused, not an infinite η (found by the finite-output property)', () => {
    // k·w0 = 0.5 and ℱ = 1e307: C1 = 12ℱ/(π·0.25) ≈ 1.5e308 is finite, 2·C1 is not
    expect(() => cooperativity({ finesse: 1e307, wavelengthM: 1e-6, waistM: 0.5e-6 / (2 * Math.PI) })).toThrow(FitInputError);
    expect(Number.isFinite(cooperativity({ finesse: 1e300, wavelengthM: 1e-6, waistM: 0.5e-6 / (2 * Math.PI) }).eta)).toBe(true);
  });
});
