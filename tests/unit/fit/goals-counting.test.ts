import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  bellThresholds,
  combinedJitter,
  evaluateCountingGoal,
  windowCapture,
  type CountingGoal,
  type SinglePhotonDetectorSpec,
} from '../../../src/lib/fit';
import { expectRel } from './helpers';

const detector = (over: Partial<SinglePhotonDetectorSpec> = {}): SinglePhotonDetectorSpec => ({
  technology: 'SNSPD',
  efficiency: { value: 0.9, tol: 0.03 },
  wavelengthNm: 1550,
  darkCountRateHz: { value: 100, tol: 50 },
  jitterFwhmS: 50e-12,
  deadTimeS: 50e-9,
  ...over,
});

const goal = (over: Partial<CountingGoal> = {}): CountingGoal => ({
  wavelengthNm: 1550,
  target: { kind: 'heralding', efficiency: 0.7 },
  opticalEfficiency: 0.85,
  ...over,
});

describe('evaluateCountingGoal (physics.md A6)', () => {
  test('heralding goal fits when η_det(−tol)·η_opt meets it', () => {
    const r = evaluateCountingGoal(goal(), detector());
    expect(r.verdict).toBe('fits');
    expectRel(r.figure, 0.9 * 0.85, 1e-12);
    expectRel(r.worst, 0.87 * 0.85, 1e-12);
    expectRel(r.headroom, (0.87 * 0.85) / 0.7 - 1, 1e-12);
  });

  test('marginal and does-not-fit on efficiency', () => {
    expect(evaluateCountingGoal(goal({ target: { kind: 'heralding', efficiency: 0.75 } }), detector()).verdict).toBe('marginal');
    const r = evaluateCountingGoal(goal({ target: { kind: 'bell', test: 'chsh' } }), detector());
    expect(r.verdict).toBe('does-not-fit');
    expectRel(r.goal, bellThresholds().chsh, 1e-12);
    expect(r.reasons[0]).toMatch(/below the CHSH threshold/);
  });

  test('Eberhard threshold 2/3 with a note that background raises it', () => {
    const r = evaluateCountingGoal(goal({ target: { kind: 'bell', test: 'eberhard' } }), detector());
    expect(r.verdict).toBe('fits');
    expect(r.notes.join(' ')).toMatch(/dark counts raise them/);
  });

  test('dead time limits the rate: non-paralyzable loss above the limit is a reason', () => {
    const r = evaluateCountingGoal(goal({ countRateHz: 5e6, maxDeadTimeLoss: 0.05 }), detector());
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons.join(' ')).toMatch(/dead time 50 ns limits the rate/);
    const c = r.constraints.find((x) => x.name === 'dead-time loss');
    const x = (0.9 * 5e6 + 100) * 50e-9;
    expectRel(c?.figure, x / (1 + x), 1e-12);
    expect(r.unit).toBe('');
    expect(r.figure).toBe(c?.figure);
  });

  test('CAR from dark counts and the window (forms 6.5, 6.6); high dark counts fail it', () => {
    const g = goal({ countRateHz: 1e5, coincidenceWindowS: 1e-9, carMin: 100 });
    const r = evaluateCountingGoal(g, detector());
    const capture = windowCapture({ windowS: 1e-9, jitterFwhmS: combinedJitter([50e-12, 50e-12]) });
    const singles = 0.9 * 1e5 + 100;
    const car = (1e5 * 0.85 * 0.81 * capture) / (singles * singles * 1e-9);
    expectRel(r.constraints.find((c) => c.name === 'coincidence-to-accidental ratio')?.figure, car, 1e-12);
    const noisy = evaluateCountingGoal(g, detector({ darkCountRateHz: { value: 5e6 } }));
    expect(noisy.verdict).toBe('does-not-fit');
    expect(noisy.reasons.join(' ')).toMatch(/CAR .* below the goal 100/);
  });

  test('jitter wider than the window lowers the counted efficiency (form 6.9)', () => {
    const r = evaluateCountingGoal(goal({ coincidenceWindowS: 100e-12 }), detector({ jitterFwhmS: 200e-12 }));
    const capture = windowCapture({ windowS: 100e-12, jitterFwhmS: combinedJitter([200e-12, 200e-12]) });
    expectRel(r.figure, 0.9 * 0.85 * capture, 1e-12);
    expect(r.verdict).toBe('does-not-fit');
  });

  test('efficiency curve is interpolated; no efficiency at the wavelength is a reason', () => {
    const curve = evaluateCountingGoal(
      goal(),
      detector({
        efficiency: undefined,
        efficiencyCurve: [
          { wavelengthNm: 1500, efficiency: 0.8 },
          { wavelengthNm: 1600, efficiency: 0.9 },
        ],
      }),
    );
    expectRel(curve.detectionEfficiency?.nominal, 0.85, 1e-12);
    const none = evaluateCountingGoal(goal({ wavelengthNm: 810 }), detector());
    expect(none.verdict).toBe('does-not-fit');
    expect(none.reasons[0]).toBe('no detection efficiency at 810 nm (stated at 1550 nm)');
  });

  test('a cooled detector carries the cryogenics caution', () => {
    expect(evaluateCountingGoal(goal(), detector({ cooling: 'closed-cycle 2.5 K' })).notes.join(' ')).toMatch(/cryogenics/);
  });

  test('invalid inputs throw FitInputError', () => {
    expect(() => evaluateCountingGoal(goal({ carMin: 10 }), detector())).toThrow(/carMin/);
    expect(() => evaluateCountingGoal(goal({ opticalEfficiency: 0 }), detector())).toThrow(FitInputError);
    expect(() => evaluateCountingGoal(goal(), detector({ deadTimeS: 0 }))).toThrow(/deadTimeS/);
  });
});
