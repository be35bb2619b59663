import { describe, expect, test } from 'vitest';
import { evaluateCavityGoal } from '../../../src/lib/fit';
import { fitCandidate } from '../../../src/lib/listings/fit-input';
import { parseMeasurementCsv } from '../../../src/lib/measurements';
import { ringdownCsv, tauForMirrorLoss } from '../../../src/server/db/synthetic';

const mirror = {
  diameterMm: 7.75,
  substrate: 'fused silica',
  rocMm: 100,
  designWavelengthNm: 852,
  bandMinNm: 835,
  bandMaxNm: 870,
  transmissionPpm: { value: 3, tol: 0.5 },
  lossPpm: { value: 2, tol: 0.5 },
  aoiDeg: 0,
};

describe('a listing’s measurements feed the fit', () => {
  test('a ring-down file replaces T + loss at its wavelength (physics.md 1.10: ℱ = π·c·τ/L)', () => {
    // 4 ppm per mirror in a 5 cm cavity: τ = L/(c·(1 − R)) (physics.md 1.8b), ℱ = π/(1 − R) ≈ 785 000
    const csv = ringdownCsv({ tauS: tauForMirrorLoss(4, 0.05), lengthM: 0.05, wavelengthNm: 852, noise: 0.005, seed: 7 });
    const parsed = parseMeasurementCsv('ringdown', csv);
    if (!parsed.ok) throw new Error(parsed.error.message);
    const candidate = fitCandidate('cavity-mirror', mirror, [parsed.data]);
    expect(candidate.kind).toBe('mirror');
    if (candidate.kind !== 'mirror') return;
    expect(candidate.spec.ringdown?.lengthM).toBe(0.05);
    const goal = { wavelengthNm: 852, lengthM: 0.05, target: { kind: 'finesse' as const, value: 300_000 }, configuration: 'pair' as const };
    const measured = evaluateCavityGoal(goal, candidate.spec);
    const fromSpec = evaluateCavityGoal(goal, mirror);
    expect(measured.figure!).toBeGreaterThan(7.6e5);
    expect(measured.figure!).toBeLessThan(8.1e5);
    // the spec alone (5 ± 1 ppm per mirror) gives ℱ ≈ 2π/10 ppm ≈ 628 000 nominal
    expect(fromSpec.figure!).toBeLessThan(6.4e5);
  });

  test('categories without a fit evaluator give no candidate', () => {
    expect(fitCandidate('nonlinear-crystal', {}).kind).toBe('none');
  });
});
