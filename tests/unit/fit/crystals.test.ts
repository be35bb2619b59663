import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  fusedSilicaIndex,
  gratingPeriodAt,
  idlerWavelength,
  ktpDatasetInfo,
  qpmPeriod,
  refractiveIndex,
} from '../../../src/lib/fit';
import { expectAbs, expectRel } from './helpers';

const KATO = 'Kato & Takaoka, Appl. Opt. 41, 5040 (2002)';
const FRADKIN = 'Fradkin et al., APL 74, 914 (1999); König & Wong, APL 84, 1644 (2004)';
const FAN = 'Fan et al., Appl. Opt. 26, 2390 (1987)';
const um = 1e-6;

describe('physics.md A9 check values (KTP, quasi-phase matching)', () => {
  test(`A9.1 ${KATO} at 1.064 µm: n_y = 1.745468, n_z = 1.829669, n_x = 1.737926 — [D]; n_y, n_z match an independent public Sellmeier library README [C]`, () => {
    const n = (axis: 'x' | 'y' | 'z') => refractiveIndex({ material: 'KTP', axis, dataset: 'kato2002', wavelengthM: 1.064 * um });
    expectAbs(n('y'), 1.745468, 2e-6);
    expectAbs(n('z'), 1.829669, 2e-6);
    expectAbs(n('x'), 1.737926, 2e-6);
  });

  test(`A9.2 ${FRADKIN} at 0.532 µm, 25 °C: n_z = 1.889521, n_y = 1.789056 — [D]`, () => {
    const n = (axis: 'y' | 'z', temperatureC?: number) =>
      refractiveIndex({
        material: 'KTP',
        axis,
        dataset: 'fradkin-koenig',
        wavelengthM: 0.532 * um,
        ...(temperatureC === undefined ? {} : { temperatureC }),
      });
    expectAbs(n('z'), 1.889521, 2e-6);
    expectAbs(n('y'), 1.789056, 2e-6);
    expectAbs(n('z', 25), 1.889521, 2e-6);
  });

  test(`A9.3 type-0 532 → 1064 + 1064 nm: Λ = 9.020 µm (Kato, 20 °C), 8.961 µm (Fradkin, 25 °C), 8.991 µm (Fan); published ≈ 9.0 µm ±1 % — ${KATO}; ${FRADKIN}; ${FAN}; [D]; published [M]`, () => {
    const p = (dataset: 'kato2002' | 'fradkin-koenig' | 'fan1987') =>
      qpmPeriod({ pumpM: 0.532 * um, signalM: 1.064 * um, type: 'type-0', dataset }) / um;
    expectAbs(p('kato2002'), 9.02, 0.002);
    expectAbs(p('fradkin-koenig'), 8.961, 0.002);
    expectAbs(p('fan1987'), 8.991, 0.002);
    for (const d of ['kato2002', 'fradkin-koenig', 'fan1987'] as const) expectRel(p(d), 9.0, 0.01);
  });

  test(`A9.4 type-II y → y + z, 405 → 810 + 810 nm: Λ = 10.032 µm (Fradkin/König), 10.113 µm (Kato), 10.095 µm (Fan); published ≈ 10.0 µm ±1.5 % — Fedrizzi et al., Opt. Express 15, 15377 (2007) [M]; [D]`, () => {
    const p = (dataset: 'kato2002' | 'fradkin-koenig' | 'fan1987') =>
      qpmPeriod({ pumpM: 0.405 * um, signalM: 0.81 * um, type: 'type-II', dataset }) / um;
    expectAbs(p('fradkin-koenig'), 10.032, 0.002);
    expectAbs(p('kato2002'), 10.113, 0.002);
    expectAbs(p('fan1987'), 10.095, 0.002);
    for (const d of ['kato2002', 'fradkin-koenig', 'fan1987'] as const) expectRel(p(d), 10.0, 0.015);
  });

  test('A9.5 type-0 405 → 810 + 810 nm: Λ = 3.434 µm (Fradkin), 3.512 µm (Kato), 3.436 µm (Fan); published ≈ 3.425 µm — [D]; published [M] (±1 % holds for Fradkin and Fan; Kato is 2.5 % off)', () => {
    const p = (dataset: 'kato2002' | 'fradkin-koenig' | 'fan1987') =>
      qpmPeriod({ pumpM: 0.405 * um, signalM: 0.81 * um, type: 'type-0', dataset }) / um;
    expectAbs(p('fradkin-koenig'), 3.434, 0.002);
    expectAbs(p('kato2002'), 3.512, 0.002);
    expectAbs(p('fan1987'), 3.436, 0.002);
    expectRel(p('fradkin-koenig'), 3.425, 0.01);
    expectRel(p('fan1987'), 3.425, 0.01);
  });

  test('A9.6 type-0 pump 532 nm, signal 810 nm: idler 1550.1 nm; Λ = 9.694 µm (Fradkin), 9.771 µm (Kato) — [D] forms 9.1, 9.2', () => {
    const idler = idlerWavelength({ pumpM: 0.532 * um, signalM: 0.81 * um });
    expectAbs(idler * 1e9, 1550.1, 0.1);
    expectAbs(qpmPeriod({ pumpM: 0.532 * um, signalM: 0.81 * um, type: 'type-0', dataset: 'fradkin-koenig' }) / um, 9.694, 0.002);
    expectAbs(qpmPeriod({ pumpM: 0.532 * um, signalM: 0.81 * um, idlerM: idler, type: 'type-0', dataset: 'kato2002' }) / um, 9.771, 0.002);
  });
});

describe('physics.md A10 check values (fused silica; Malitson, "Interspecimen comparison of the refractive index of fused silica", J. Opt. Soc. Am. 55, 1205 (1965))', () => {
  test('A10.1 λ = 0.5876 µm: n = 1.458462 (public refractive-index database 1.45846, abs 1e-5) — [C]; [D]', () => {
    expectAbs(fusedSilicaIndex({ wavelengthM: 0.5876 * um }), 1.458462, 2e-6);
    expectAbs(fusedSilicaIndex({ wavelengthM: 0.5876 * um }), 1.45846, 1e-5);
  });

  test('A10.2 λ = 0.6328 µm: n = 1.457018 — [D]', () => {
    expectAbs(fusedSilicaIndex({ wavelengthM: 0.6328 * um }), 1.457018, 2e-6);
  });

  test('A10.3 λ = 1.064 µm: n = 1.449631 — [D]', () => {
    expectAbs(fusedSilicaIndex({ wavelengthM: 1.064 * um }), 1.449631, 2e-6);
  });

  test('A10.4 λ = 0.4047 µm: n = 1.469613 — [D]', () => {
    expectAbs(fusedSilicaIndex({ wavelengthM: 0.4047 * um }), 1.469613, 2e-6);
  });
});

describe('crystal edges and temperature (Emanueli & Arie, Appl. Opt. 42, 6661 (2003))', () => {
  test('thermo-optic terms raise n_z with temperature and vanish at 25 °C', () => {
    const n = (temperatureC: number) =>
      refractiveIndex({ material: 'KTP', axis: 'z', dataset: 'fradkin-koenig', wavelengthM: 1.064 * um, temperatureC });
    expect(n(25)).toBe(refractiveIndex({ material: 'KTP', axis: 'z', dataset: 'fradkin-koenig', wavelengthM: 1.064 * um }));
    expect(n(60)).toBeGreaterThan(n(25));
    const dndt = (n(26) - n(24)) / 2;
    expectRel(dndt, (9.9587 + 9.9228 / 1.064 - 8.9603 / 1.064 ** 2 + 4.101 / 1.064 ** 3) * 1e-6, 1e-3);
  });

  test('grating expansion 9.4: α = 6.7e-6 /K, β = 11e-9 /K²', () => {
    expectRel(gratingPeriodAt({ periodAt25CM: 9e-6, temperatureC: 125 }), 9e-6 * (1 + 6.7e-4 + 11e-5), 1e-12);
  });

  test('sets without a temperature model refuse a temperature other than their reference', () => {
    expect(() => refractiveIndex({ material: 'KTP', axis: 'z', dataset: 'kato2002', wavelengthM: 1e-6, temperatureC: 40 })).toThrow(
      FitInputError,
    );
    expect(refractiveIndex({ material: 'KTP', axis: 'z', dataset: 'kato2002', wavelengthM: 1e-6, temperatureC: 20 })).toBeGreaterThan(1.8);
    expect(() => refractiveIndex({ material: 'KTP', axis: 'z', dataset: 'fan1987', wavelengthM: 1e-6, temperatureC: 25 })).toThrow(
      /temperature/,
    );
  });

  test('no x axis in the Fradkin/König set; outside the KTP window throws', () => {
    expect(() => refractiveIndex({ material: 'KTP', axis: 'x', dataset: 'fradkin-koenig', wavelengthM: 1e-6 })).toThrow(/axis/);
    expect(() => refractiveIndex({ material: 'KTP', axis: 'z', dataset: 'kato2002', wavelengthM: 6e-6 })).toThrow(/wavelengthM/);
  });

  test('inconsistent idler and a signal shorter than the pump throw', () => {
    expect(() => qpmPeriod({ pumpM: 532e-9, signalM: 1064e-9, idlerM: 1000e-9, type: 'type-0', dataset: 'kato2002' })).toThrow(/idlerM/);
    expect(() => qpmPeriod({ pumpM: 532e-9, signalM: 500e-9, type: 'type-0', dataset: 'kato2002' })).toThrow(/signalM/);
  });

  test('dataset info states the reference temperature and fitted range (physics.md A9 validity)', () => {
    expect(ktpDatasetInfo('kato2002').fittedRangeM).toEqual([0.43e-6, 3.54e-6]);
    expect(ktpDatasetInfo('fradkin-koenig').referenceTemperatureC).toBe(25);
    expect(ktpDatasetInfo('fan1987').note).toMatch(/telecom/);
  });

  test('fused silica outside 0.21–6.7 µm throws', () => {
    expect(() => fusedSilicaIndex({ wavelengthM: 0.2e-6 })).toThrow(FitInputError);
  });
});
