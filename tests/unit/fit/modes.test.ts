import { describe, expect, test } from 'vitest';
import { FitInputError, gaussianMode } from '../../../src/lib/fit';
import { expectRel } from './helpers';

describe('physics.md A2 check values (Kogelnik & Li, "Laser Beams and Resonators", Appl. Opt. 5, 1550 (1966))', () => {
  test('A2.1 Advanced LIGO arm L = 3995 m, R = 1934 / 2245 m, 1064 nm: g1, g2, g1g2, spot radii 5.3032 / 6.2007 cm, waist 1.2029 cm at 1834.49 m, z_R = 427.25 m, ψ = 2.71753, Δν_T = 32.4563 kHz = FSR − 5.0647 kHz — geometry and published radii 5.3 / 6.2 cm (±2 %) from Aasi et al., Class. Quantum Grav. 32, 074001 (2015) [M]; digits [D]', () => {
    const m = gaussianMode({ lengthM: 3995, roc1M: 1934, roc2M: 2245, wavelengthM: 1064e-9 });
    expect(m.stable).toBe(true);
    expectRel(m.g1, -1.065667, 1e-4);
    expectRel(m.g2, -0.77951, 1e-4);
    expectRel(m.g1g2, 0.830698, 1e-4);
    expectRel(m.w1M, 5.3032e-2, 1e-4);
    expectRel(m.w2M, 6.2007e-2, 1e-4);
    expectRel(m.w1M, 5.3e-2, 0.02);
    expectRel(m.w2M, 6.2e-2, 0.02);
    expectRel(m.w0M, 1.2029e-2, 1e-4);
    expectRel(m.waistFromMirror1M, 1834.49, 1e-4);
    expectRel(m.rayleighRangeM, 427.25, 1e-4);
    expectRel(m.gouyPhaseRad, 2.71753, 1e-4);
    expectRel(m.transverseModeSpacingHz, 32456.3, 1e-4);
    expectRel(m.transverseModeOffsetHz, 5064.7, 1e-4);
  });

  test('A2.2 symmetric confocal L = 1 m, 632.8 nm: w0 = 0.31735 mm, w_mirror = 0.44881 mm, Δν_T = FSR/2 = 74.948 MHz — [D] form 2.4 (textbook He-Ne confocal example [M])', () => {
    const m = gaussianMode({ lengthM: 1, roc1M: 1, roc2M: 1, wavelengthM: 632.8e-9 });
    expect(m.stable).toBe(true);
    expect(m.marginal).toBe(true);
    expectRel(m.w0M, 0.31735e-3, 1e-4);
    expectRel(m.w1M, 0.44881e-3, 1e-4);
    expectRel(m.w2M, 0.44881e-3, 1e-4);
    expectRel(m.transverseModeSpacingHz, 74.948e6, 1e-4);
    expectRel(m.rayleighRangeM, 0.5, 1e-12);
  });

  test('A2.3 plano-concave L = 0.1 m, R1 = ∞, R2 = 1 m, 1064 nm: g = 1, 0.9; w0 = w1 = 318.76 µm, w2 = 336.00 µm, z_R = 0.3000 m = √(L(R − L)), ψ = 0.321751, Δν_T = 153.518 MHz — [D] form 2.3', () => {
    const m = gaussianMode({ lengthM: 0.1, roc1M: Infinity, roc2M: 1, wavelengthM: 1064e-9 });
    expect(m.g1).toBe(1);
    expectRel(m.g2, 0.9, 1e-12);
    expectRel(m.w0M, 318.76e-6, 1e-4);
    expectRel(m.w1M, 318.76e-6, 1e-4);
    expectRel(m.w2M, 336.0e-6, 1e-4);
    expect(m.waistFromMirror1M).toBe(0);
    expectRel(m.rayleighRangeM, 0.3, 1e-4);
    expectRel(m.rayleighRangeM, Math.sqrt(0.1 * (1 - 0.1)), 1e-9);
    expectRel(m.gouyPhaseRad, 0.321751, 1e-4);
    expectRel(m.transverseModeSpacingHz, 153.518e6, 1e-4);
  });

  test('A2.4 symmetric L = 0.25 m, R = 0.10 m: g = −1.5, g1g2 = 2.25, unstable (no Gaussian mode) — [D] form 2.2', () => {
    const m = gaussianMode({ lengthM: 0.25, roc1M: 0.1, roc2M: 0.1, wavelengthM: 1064e-9 });
    expect(m.g1).toBe(-1.5);
    expect(m.g1g2).toBe(2.25);
    expect(m.stable).toBe(false);
    expect(m.marginal).toBe(false);
    expect(m.w0M).toBeNull();
    expect(m.reason).toMatch(/unstable: g1·g2 = 2\.25/);
  });

  test('A2.5 symmetric L = 0.2 m, R = 0.5 m, 1064 nm: g = 0.6, w0 = 260.26 µm, w_mirror = 290.98 µm, z_R = 0.2000 m, ψ = 0.927295, Δν_T = 221.222 MHz — [D]', () => {
    const m = gaussianMode({ lengthM: 0.2, roc1M: 0.5, roc2M: 0.5, wavelengthM: 1064e-9 });
    expectRel(m.g1, 0.6, 1e-12);
    expectRel(m.w0M, 260.26e-6, 1e-4);
    expectRel(m.w1M, 290.98e-6, 1e-4);
    expectRel(m.rayleighRangeM, 0.2, 1e-4);
    expectRel(m.gouyPhaseRad, 0.927295, 1e-4);
    expectRel(m.transverseModeSpacingHz, 221.222e6, 1e-4);
  });

  test('A2.6 near-concentric L = 0.099 m, R = 0.05 m, 1064 nm: g = −0.98, w0 = 41.048 µm, w_mirror = 410.48 µm, Δν_T = 1417.55 MHz, 96.552 MHz below FSR = 1514.10 MHz — [D]', () => {
    const m = gaussianMode({ lengthM: 0.099, roc1M: 0.05, roc2M: 0.05, wavelengthM: 1064e-9 });
    expectRel(m.g1, -0.98, 1e-9);
    expectRel(m.w0M, 41.048e-6, 1e-4);
    expectRel(m.w1M, 410.48e-6, 1e-4);
    expectRel(m.transverseModeSpacingHz, 1417.55e6, 1e-4);
    expectRel(m.transverseModeOffsetHz, 96.552e6, 1e-4);
    expectRel(m.fsrHz, 1514.1e6, 1e-4);
  });

  test('A2.7 symmetric confocal L = 0.5 m, 1064 nm: w0 = 290.98 µm, w_mirror = 411.51 µm, Δν_T = 149.896 MHz — [D] form 2.4', () => {
    const m = gaussianMode({ lengthM: 0.5, roc1M: 0.5, roc2M: 0.5, wavelengthM: 1064e-9 });
    expectRel(m.w0M, 290.98e-6, 1e-4);
    expectRel(m.w1M, 411.51e-6, 1e-4);
    expectRel(m.transverseModeSpacingHz, 149.896e6, 1e-4);
  });
});

describe('stability edges and input checks', () => {
  test('plane–plane is marginal with no mode (g1·g2 = 1), not a number', () => {
    const m = gaussianMode({ lengthM: 0.1, roc1M: Infinity, roc2M: Infinity, wavelengthM: 1064e-9 });
    expect(m.stable).toBe(false);
    expect(m.marginal).toBe(true);
    expect(m.w0M).toBeNull();
  });

  test('concentric (L = 2R) is marginal', () => {
    const m = gaussianMode({ lengthM: 0.2, roc1M: 0.1, roc2M: 0.1, wavelengthM: 1064e-9 });
    expect(m.g1g2).toBe(1);
    expect(m.marginal).toBe(true);
    expect(m.stable).toBe(false);
  });

  test('g1·g2 = 0 with g1 ≠ g2 (half-confocal edge) is marginal', () => {
    const m = gaussianMode({ lengthM: 0.5, roc1M: 0.5, roc2M: 2, wavelengthM: 1064e-9 });
    expect(m.marginal).toBe(true);
    expect(m.stable).toBe(false);
  });

  test('convex mirror (negative radius) is accepted; zero radius and NaN are not', () => {
    expect(gaussianMode({ lengthM: 0.1, roc1M: -1, roc2M: 0.5, wavelengthM: 1064e-9 }).stable).toBe(true);
    expect(() => gaussianMode({ lengthM: 0.1, roc1M: 0, roc2M: 1, wavelengthM: 1064e-9 })).toThrow(FitInputError);
    expect(() => gaussianMode({ lengthM: 0.1, roc1M: Number.NaN, roc2M: 1, wavelengthM: 1064e-9 })).toThrow(/roc1M/);
    expect(() => gaussianMode({ lengthM: -0.1, roc1M: 1, roc2M: 1, wavelengthM: 1064e-9 })).toThrow(/lengthM/);
  });
});
