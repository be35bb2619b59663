import { describe, expect, test } from 'vitest';
import { FitInputError, coherenceLength, evaluateLaserGoal, type LaserGoal, type LaserSpec } from '../../../src/lib/fit';
import { expectRel } from './helpers';

const laser = (over: Partial<LaserSpec> = {}): LaserSpec => ({
  type: 'ECDL',
  centreWavelengthNm: 780,
  tuningMinNm: 770,
  tuningMaxNm: 790,
  linewidthHz: { value: 100e3, tol: 50e3 },
  powerW: { value: 0.08, tol: 0.01 },
  singleFrequency: true,
  fibreOutput: false,
  ...over,
});

const goal = (over: Partial<LaserGoal> = {}): LaserGoal => ({
  wavelength: { kind: 'fixed', nm: 780.241 },
  coherence: { kind: 'linewidth', maxHz: 200e3 },
  minPowerW: 0.05,
  ...over,
});

describe('evaluateLaserGoal (physics.md A8)', () => {
  test('fits: inside tuning, linewidth at +tol and power at −tol meet the goals; figure is the limiting constraint', () => {
    const r = evaluateLaserGoal(goal(), laser());
    expect(r.verdict).toBe('fits');
    expect(r.constraints).toHaveLength(2);
    expect(r.unit).toBe('Hz');
    expectRel(r.headroom, 200e3 / 150e3 - 1, 1e-12);
    expect(r.hazard.hazardClass).toBe('unknown');
    expect(r.hazard.atMostClass).toBe('3B');
    expect(r.notes.join(' ')).toMatch(/laser safety officer/);
  });

  test('coherence-length goal uses L_c = c/(πΔν) (form 8.1)', () => {
    const r = evaluateLaserGoal(goal({ coherence: { kind: 'coherence-length', minM: 500 }, minPowerW: undefined }), laser());
    expectRel(r.figure, coherenceLength({ linewidthHz: 100e3 }), 1e-12);
    expectRel(r.worst, coherenceLength({ linewidthHz: 150e3 }), 1e-12);
    expect(r.verdict).toBe('fits');
  });

  test('marginal on the linewidth tolerance; does-not-fit on power', () => {
    expect(evaluateLaserGoal(goal({ coherence: { kind: 'linewidth', maxHz: 120e3 } }), laser()).verdict).toBe('marginal');
    const weak = evaluateLaserGoal(goal({ minPowerW: 0.2 }), laser());
    expect(weak.verdict).toBe('does-not-fit');
    expect(weak.reasons[0]).toMatch(/power 80 mW below the 200 mW goal/);
  });

  test('wavelength outside the tuning range and a fixed laser that misses', () => {
    const out = evaluateLaserGoal(goal({ wavelength: { kind: 'fixed', nm: 852 } }), laser());
    expect(out.verdict).toBe('does-not-fit');
    expect(out.headroom).toBeNull();
    expect(out.reasons[0]).toBe('tuning 770–790 nm does not reach 852 nm');
    const fixed = evaluateLaserGoal(
      goal({ wavelength: { kind: 'fixed', nm: 1064.5 } }),
      laser({ centreWavelengthNm: 1064, tuningMinNm: undefined, tuningMaxNm: undefined }),
    );
    expect(fixed.reasons[0]).toBe('fixed at 1064 nm (no tuning range listed) does not reach 1064.5 nm');
    const slack = evaluateLaserGoal(
      goal({ wavelength: { kind: 'fixed', nm: 1064.5, toleranceNm: 1 } }),
      laser({ centreWavelengthNm: 1064, tuningMinNm: undefined, tuningMaxNm: undefined }),
    );
    expect(slack.verdict).toBe('fits');
  });

  test('a wavelength range must lie wholly inside the tuning range', () => {
    expect(evaluateLaserGoal(goal({ wavelength: { kind: 'range', minNm: 775, maxNm: 785 } }), laser()).verdict).toBe('fits');
    const r = evaluateLaserGoal(goal({ wavelength: { kind: 'range', minNm: 775, maxNm: 795 } }), laser());
    expect(r.reasons[0]).toBe('tuning 770–790 nm does not cover 775–795 nm');
  });

  test('wavelength-only goal: verdict from coverage, no figure', () => {
    const r = evaluateLaserGoal({ wavelength: { kind: 'fixed', nm: 780 } }, laser());
    expect(r.verdict).toBe('fits');
    expect(r.figure).toBeNull();
  });

  test('hazard suggestion uses the upper power tolerance; IR stays unknown below 0.5 W', () => {
    expect(
      evaluateLaserGoal(
        goal({ wavelength: { kind: 'fixed', nm: 1064 } }),
        laser({ centreWavelengthNm: 1064, tuningMinNm: 1063, tuningMaxNm: 1065, powerW: { value: 0.45, tol: 0.1 } }),
      ).hazard.hazardClass,
    ).toBe('4');
    expect(
      evaluateLaserGoal(
        goal({ wavelength: { kind: 'fixed', nm: 1064 } }),
        laser({ centreWavelengthNm: 1064, tuningMinNm: 1063, tuningMaxNm: 1065, powerW: { value: 0.1 } }),
      ).hazard.hazardClass,
    ).toBe('unknown');
  });

  test('multimode laser with a coherence goal gets a validity note', () => {
    expect(evaluateLaserGoal(goal(), laser({ singleFrequency: false })).notes.join(' ')).toMatch(/not single-frequency/);
  });

  test('invalid inputs throw FitInputError', () => {
    expect(() => evaluateLaserGoal(goal(), laser({ linewidthHz: { value: 0 } }))).toThrow(/linewidthHz/);
    expect(() => evaluateLaserGoal(goal(), laser({ tuningMinNm: 800 }))).toThrow(FitInputError);
    expect(() => evaluateLaserGoal(goal({ wavelength: { kind: 'range', minNm: 790, maxNm: 780 } }), laser())).toThrow(/minNm/);
  });
});
