import { describe, expect, test } from 'vitest';
import { FitInputError, scatterLimitedFinesse, totalIntegratedScatter } from '../../../src/lib/fit';
import { expectRel } from './helpers';

const SOURCES = 'Davies, Proc. IEE 101, 209 (1954) [M]; Bennett & Porteus, J. Opt. Soc. Am. 51, 123 (1961) [M]';

describe(`physics.md A3 check values (TIS; ${SOURCES})`, () => {
  test('A3.1 σ = 0.1 nm, λ = 633 nm: TIS = 3.9411e-6 — [D] form 3.3', () => {
    expectRel(totalIntegratedScatter({ roughnessM: 0.1e-9, wavelengthM: 633e-9 }), 3.9411e-6, 1e-4);
  });

  test('A3.2 σ = 1 nm, λ = 633 nm: 3.9411e-4, exact form 3.2 gives 3.9403e-4 — [D]', () => {
    expectRel(totalIntegratedScatter({ roughnessM: 1e-9, wavelengthM: 633e-9 }), 3.9411e-4, 1e-4);
    expectRel(totalIntegratedScatter({ roughnessM: 1e-9, wavelengthM: 633e-9, exact: true }), 3.9403e-4, 1e-4);
  });

  test('A3.3 σ = 0.1 nm, λ = 1064 nm: 1.3949e-6, scatter-limited ℱ_max ≈ 2.25e6 — [D] forms 3.3, 3.4', () => {
    const tis = totalIntegratedScatter({ roughnessM: 0.1e-9, wavelengthM: 1064e-9 });
    expectRel(tis, 1.3949e-6, 1e-4);
    expectRel(scatterLimitedFinesse({ scatterLoss: tis }), 2.25e6, 1e-3);
  });

  test('A3.4 σ = 1 nm, λ = 1064 nm: 1.3949e-4 — [D]', () => {
    expectRel(totalIntegratedScatter({ roughnessM: 1e-9, wavelengthM: 1064e-9 }), 1.3949e-4, 1e-4);
  });

  test('A3.5 σ = 1 nm, λ = 633 nm, θ = 45°: 1.9705e-4 — [D]', () => {
    expectRel(totalIntegratedScatter({ roughnessM: 1e-9, wavelengthM: 633e-9, aoiRad: Math.PI / 4 }), 1.9705e-4, 1e-4);
  });

  test('A3.6 σ = 0.2 nm, λ = 1550 nm: 2.6292e-6 — [D]', () => {
    expectRel(totalIntegratedScatter({ roughnessM: 0.2e-9, wavelengthM: 1550e-9 }), 2.6292e-6, 1e-4);
  });

  test('A3.7 σ = 2 nm, λ = 1064 nm, θ = 45°: 2.7898e-4 — [D]', () => {
    expectRel(totalIntegratedScatter({ roughnessM: 2e-9, wavelengthM: 1064e-9, aoiRad: Math.PI / 4 }), 2.7898e-4, 1e-4);
  });

  test('A3 validity: form 3.3 is within 0.5 % of 3.2 for σ/λ < 0.005 — physics.md A3 [D]', () => {
    const smooth = totalIntegratedScatter({ roughnessM: 0.005 * 1064e-9, wavelengthM: 1064e-9 });
    const exact = totalIntegratedScatter({ roughnessM: 0.005 * 1064e-9, wavelengthM: 1064e-9, exact: true });
    expect(smooth / exact - 1).toBeLessThan(0.005);
  });
});

describe('scatter input checks', () => {
  test('grazing incidence and negative roughness throw', () => {
    expect(() => totalIntegratedScatter({ roughnessM: 1e-9, wavelengthM: 1e-6, aoiRad: Math.PI / 2 })).toThrow(FitInputError);
    expect(() => totalIntegratedScatter({ roughnessM: -1e-9, wavelengthM: 1e-6 })).toThrow(/roughnessM/);
  });
});
