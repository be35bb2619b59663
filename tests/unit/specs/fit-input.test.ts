// The stored specs of each category are the fit engine's input as they are: assigning them to the
// engine's spec types is checked by the compiler, and each evaluator runs on them.

import { describe, expect, test } from 'vitest';
import {
  evaluateCavityGoal,
  evaluateCountingGoal,
  evaluateLaserGoal,
  evaluateSqueezingGoal,
  type LaserSpec,
  type MirrorSpec,
  type PhotodiodeSpec,
  type SinglePhotonDetectorSpec,
} from '../../../src/lib/fit';
import { suggestedHazardClass } from '../../../src/lib/specs';
import { expectRel } from '../fit/helpers';
import { BALANCED_SPECS, LASER_SPECS, MIRROR_SPECS, PHOTODIODE_SPECS, SPD_SPECS } from './fixtures';

const mirror: MirrorSpec = MIRROR_SPECS;
const photodiode: PhotodiodeSpec = PHOTODIODE_SPECS;
const balanced: PhotodiodeSpec = BALANCED_SPECS;
const detector: SinglePhotonDetectorSpec = SPD_SPECS;
const laser: LaserSpec = LASER_SPECS;

describe('stored specs go into the evaluators unchanged', () => {
  test('cavity: two stored mirrors of 2 + 8 ppm give ℱ ≈ 2π/(20 ppm) = 314 159 (physics.md A1 form 1.5, low-loss; 1.3 within 𝓛/4)', () => {
    const r = evaluateCavityGoal(
      { wavelengthNm: 780, lengthM: 0.05, target: { kind: 'finesse', value: 2e5 }, configuration: 'pair' },
      mirror,
    );
    expect(r.verdict).toBe('fits');
    expectRel(r.finesse?.nominal, (2 * Math.PI) / 20e-6, 1e-4);
  });

  test('cavity: outside the stored coating band the mirror does not fit ("out of band", product.md goal semantics)', () => {
    const r = evaluateCavityGoal(
      { wavelengthNm: 852, lengthM: 0.05, target: { kind: 'finesse', value: 2e5 }, configuration: 'pair' },
      mirror,
    );
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons.join(' ')).toMatch(/out of band/);
  });

  test.each([
    ['photodiode', photodiode],
    ['balanced detector', balanced],
  ])('squeezing with a stored %s reads its QE at the stated wavelength', (_name, d) => {
    const r = evaluateSqueezingGoal(
      {
        wavelengthNm: 1550,
        targetDb: 6,
        sidebandHz: 5e6,
        source: { kind: 'initial', initialDb: 12 },
        escapeEfficiency: 0.98,
        propagationEfficiency: 0.98,
        visibility: 0.99,
        loPowerW: 5e-3,
      },
      d,
    );
    expect(r.qeSource).toBe('spec');
    expect(r.quantumEfficiency?.nominal).toBe(0.99);
  });

  test('counting with a stored single-photon detector', () => {
    const r = evaluateCountingGoal(
      { wavelengthNm: 1550, target: { kind: 'heralding', efficiency: 0.5 }, opticalEfficiency: 0.8 },
      detector,
    );
    expect(r.detectionEfficiency?.nominal).toBe(0.9);
    expect(r.verdict).toBe('fits');
  });

  test('laser with stored specs; the stored hazard class agrees with the suggestion for a 2 W beam (physics.md A8.4: 1064 nm, 2 W → Class 4)', () => {
    const r = evaluateLaserGoal(
      { wavelength: { kind: 'fixed', nm: 1064 }, coherence: { kind: 'linewidth', maxHz: 10e3 }, minPowerW: 1 },
      laser,
    );
    expect(r.verdict).toBe('fits');
    expect(suggestedHazardClass(LASER_SPECS).hazardClass).toBe(LASER_SPECS.hazardClass);
  });
});
