import { describe, expect, test } from 'vitest';
import {
  ELEMENTARY_CHARGE,
  FitInputError,
  evaluateSqueezingGoal,
  lossyVariance,
  opoQuadratures,
  quantumEfficiencyFromResponsivity,
  varianceFromDb,
  type PhotodiodeSpec,
  type SqueezingGoal,
} from '../../../src/lib/fit';
import { expectRel } from './helpers';

const H = 6.62607015e-34;
const C = 299792458;

const detector = (over: Partial<PhotodiodeSpec> = {}): PhotodiodeSpec => ({
  material: 'InGaAs',
  quantumEfficiency: { value: 0.99, tol: 0.005 },
  wavelengthNm: 1550,
  bandwidthHz: 100e6,
  noiseCurrentAPerRtHz: { value: 3e-12, tol: 0.5e-12 },
  saturationPowerW: 20e-3,
  ...over,
});

const goal = (over: Partial<SqueezingGoal> = {}): SqueezingGoal => ({
  wavelengthNm: 1550,
  targetDb: 8,
  sidebandHz: 5e6,
  source: { kind: 'initial', initialDb: 15 },
  escapeEfficiency: 0.98,
  propagationEfficiency: 0.98,
  visibility: 0.99,
  loPowerW: 5e-3,
  ...over,
});

/** η_el from forms 12.1–12.3 at the LO photocurrent. */
function etaEl(qe: number, noise: number, lambdaM = 1550e-9, lo = 5e-3): number {
  const i = (qe * ELEMENTARY_CHARGE * lambdaM * lo) / (H * C);
  const s = (2 * ELEMENTARY_CHARGE * i) / (noise * noise);
  return s / (1 + s);
}

describe('evaluateSqueezingGoal (physics.md A5 forms 5.1, 5.5, 5.6; A12 forms 12.1–12.4)', () => {
  test('fits: predicted measured squeezing from the initial state through the whole chain (5.1, 5.5)', () => {
    const r = evaluateSqueezingGoal(goal(), detector());
    const eta = 0.98 * 0.98 * 0.99 ** 2 * 0.99 * etaEl(0.99, 3e-12);
    const expected = -10 * Math.log10(lossyVariance({ variance: varianceFromDb(15), efficiency: eta }));
    expect(r.verdict).toBe('fits');
    expect(r.pass).toBe(true);
    expectRel(r.figure, expected, 1e-9);
    expectRel(r.totalEfficiency?.nominal, eta, 1e-12);
    expect(r.unit).toBe('dB');
    expectRel(r.headroom, (r.worst as number) - 8, 1e-12);
  });

  test('worst case: QE at −tol and noise at +tol', () => {
    const r = evaluateSqueezingGoal(goal(), detector());
    const eta = 0.98 * 0.98 * 0.99 ** 2 * 0.985 * etaEl(0.985, 3.5e-12);
    expectRel(r.totalEfficiency?.worst, eta, 1e-12);
    expect(r.worst).toBeLessThan(r.figure as number);
  });

  test('marginal and does-not-fit', () => {
    const nominal = evaluateSqueezingGoal(goal(), detector()).figure as number;
    const worst = evaluateSqueezingGoal(goal(), detector()).worst as number;
    const marginal = evaluateSqueezingGoal(goal({ targetDb: (nominal + worst) / 2 }), detector());
    expect(marginal.verdict).toBe('marginal');
    expect(marginal.reasons[0]).toMatch(/worst case .* misses/);
    const miss = evaluateSqueezingGoal(goal({ targetDb: nominal + 0.5 }), detector());
    expect(miss.verdict).toBe('does-not-fit');
  });

  test('A12.3 through the evaluator: 15 → 10 dB with a 20 dB-clearance detector needs QE 0.997333 — [D] form 12.4', () => {
    const qe = 0.999;
    const i = (qe * ELEMENTARY_CHARGE * 1550e-9 * 5e-3) / (H * C);
    const noise = Math.sqrt((2 * ELEMENTARY_CHARGE * i) / 99);
    const r = evaluateSqueezingGoal(
      goal({ targetDb: 10 }),
      detector({ quantumEfficiency: { value: qe }, noiseCurrentAPerRtHz: { value: noise } }),
    );
    expectRel(r.clearanceDb?.nominal, 20, 1e-12);
    expectRel(r.requiredQE, 0.997333, 1e-5);
    expect(r.verdict).toBe('fits');
  });

  test('OPO source: Ω/γ_c = f/(Δν/2), figure = opoQuadratures at the total efficiency (5.6, 5.7)', () => {
    const source = { kind: 'opo' as const, pumpParameter: 0.8, linewidthHz: 60e6 };
    const r = evaluateSqueezingGoal(
      goal({ source, phaseNoiseRad: 0.01 }),
      detector({ quantumEfficiency: { value: 0.99 }, noiseCurrentAPerRtHz: { value: 3e-12 } }),
    );
    const eta = r.totalEfficiency?.nominal as number;
    const q = opoQuadratures({ pumpParameter: 0.8, omegaOverGamma: 5e6 / 30e6, efficiency: eta, phaseNoiseRad: 0.01 });
    expectRel(r.figure, q.squeezedDb, 1e-9);
    expectRel(r.antiSqueezedDb, q.antiSqueezedDb, 1e-9);
  });

  test('bandwidth below the sideband: "bandwidth 10 MHz below the 20 MHz sideband"', () => {
    const r = evaluateSqueezingGoal(goal({ sidebandHz: 20e6 }), detector({ bandwidthHz: 10e6 }));
    expect(r.verdict).toBe('does-not-fit');
    expect(r.headroom).toBeNull();
    expect(r.reasons).toContain('bandwidth 10 MHz below the 20 MHz sideband');
  });

  test('LO power above the saturation power does not fit', () => {
    const r = evaluateSqueezingGoal(goal({ loPowerW: 30e-3 }), detector());
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons.join(' ')).toMatch(/local oscillator 30 mW above the 20 mW saturation power/);
  });

  test('QE from a curve (linear interpolation) and from responsivity (12.1)', () => {
    const curve = evaluateSqueezingGoal(
      goal(),
      detector({
        quantumEfficiency: undefined,
        wavelengthNm: undefined,
        qeCurve: [
          { wavelengthNm: 1500, qe: 0.96 },
          { wavelengthNm: 1600, qe: 0.98 },
        ],
      }),
    );
    expect(curve.qeSource).toBe('curve');
    expectRel(curve.quantumEfficiency?.nominal, 0.97, 1e-12);
    const resp = evaluateSqueezingGoal(goal(), detector({ quantumEfficiency: undefined, responsivityAW: { value: 1.2, tol: 0.01 } }));
    expect(resp.qeSource).toBe('responsivity');
    expectRel(resp.quantumEfficiency?.nominal, quantumEfficiencyFromResponsivity({ responsivityAW: 1.2, wavelengthM: 1550e-9 }), 1e-12);
    expectRel(resp.quantumEfficiency?.worst, quantumEfficiencyFromResponsivity({ responsivityAW: 1.19, wavelengthM: 1550e-9 }), 1e-12);
  });

  test('no QE at the wavelength: a reason, no figure', () => {
    const r = evaluateSqueezingGoal(goal({ wavelengthNm: 1064 }), detector());
    expect(r.verdict).toBe('does-not-fit');
    expect(r.figure).toBeNull();
    expect(r.reasons[0]).toBe('no quantum efficiency at 1064 nm (stated at 1550 nm)');
  });

  test('no noise figure: electronics taken as noiseless, verdict at most marginal', () => {
    const r = evaluateSqueezingGoal(goal(), detector({ noiseCurrentAPerRtHz: undefined }));
    expect(r.verdict).toBe('marginal');
    expect(r.clearanceDb).toBeNull();
    expect(r.reasons.join(' ')).toMatch(/clearance unknown/);
  });

  test('NEP gives the noise current via the responsivity', () => {
    const qe = 0.99;
    const resp = (qe * ELEMENTARY_CHARGE * 1550e-9) / (H * C);
    const r = evaluateSqueezingGoal(
      goal(),
      detector({ noiseCurrentAPerRtHz: undefined, nepWPerRtHz: 3e-12 / resp, quantumEfficiency: { value: qe } }),
    );
    expectRel(r.electronicEfficiency?.nominal, etaEl(qe, 3e-12), 1e-9);
  });

  test('required QE above 1 is a reason; the ideal-electronics headline stays reported', () => {
    const r = evaluateSqueezingGoal(goal({ targetDb: 13, source: { kind: 'initial', initialDb: 15 } }), detector());
    expect(r.requiredQEIdealElectronics).toBeGreaterThan(1);
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons.join(' ')).toMatch(/above 1/);
  });

  test('invalid goal inputs throw FitInputError', () => {
    expect(() => evaluateSqueezingGoal(goal({ visibility: 1.2 }), detector())).toThrow(/goal\.visibility/);
    expect(() => evaluateSqueezingGoal(goal({ loPowerW: 0 }), detector())).toThrow(FitInputError);
    expect(() => evaluateSqueezingGoal(goal(), detector({ quantumEfficiency: { value: 1.1 } }))).toThrow(/quantumEfficiency/);
    expect(() => evaluateSqueezingGoal(goal(), detector({ quantumEfficiency: undefined, responsivityAW: { value: 2 } }))).toThrow(
      /responsivityAW/,
    );
  });
});
