import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  darkNoiseClearance,
  quantumEfficiencyFromResponsivity,
  responsivityFromQuantumEfficiency,
  shotNoiseCurrent,
} from '../../../src/lib/fit';
import { expectRel } from './helpers';

describe('physics.md A12 check values (detectors; CODATA 2018 exact constants; Appel et al., PRA 75, 035802 (2007) [M])', () => {
  test('A12.1 ℜ = 1.2 A/W at 1550 nm and 0.6 A/W at 1064 nm: η_QE = 0.959878, 0.699159 — [D] form 12.1', () => {
    expectRel(quantumEfficiencyFromResponsivity({ responsivityAW: 1.2, wavelengthM: 1550e-9 }), 0.959878, 1e-5);
    expectRel(quantumEfficiencyFromResponsivity({ responsivityAW: 0.6, wavelengthM: 1064e-9 }), 0.699159, 1e-5);
    expectRel(responsivityFromQuantumEfficiency({ quantumEfficiency: 0.959878, wavelengthM: 1550e-9 }), 1.2, 1e-5);
  });

  test('A12.2 P_LO = 5 mW, ℜ = 0.8 A/W, i_n = 5 pA/√Hz: I = 4 mA, s = 51.2697, C = 17.1825 dB, η_el = 0.980868 — [D] forms 12.2–12.3', () => {
    const photocurrentA = 0.8 * 5e-3;
    expectRel(photocurrentA, 4e-3, 1e-12);
    const c = darkNoiseClearance({ photocurrentA, noiseCurrentAPerRtHz: 5e-12 });
    expectRel(c.ratio, 51.2697, 1e-5);
    expectRel(c.clearanceDb, 17.1825, 1e-5);
    expectRel(c.efficiency, 0.980868, 1e-5);
    expectRel(shotNoiseCurrent({ photocurrentA }) ** 2 / 25e-24, c.ratio, 1e-12);
  });

  test('zero photocurrent or noise throws', () => {
    expect(() => darkNoiseClearance({ photocurrentA: 0, noiseCurrentAPerRtHz: 5e-12 })).toThrow(FitInputError);
    expect(() => darkNoiseClearance({ photocurrentA: 1e-3, noiseCurrentAPerRtHz: -1 })).toThrow(/noiseCurrentAPerRtHz/);
  });
});
