import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  electronicEfficiency,
  escapeEfficiency,
  lossyVariance,
  maxSqueezingDb,
  opoQuadratures,
  optimumPump,
  requiredDetectorEfficiency,
  requiredEfficiency,
  totalEfficiency,
  varianceFromDb,
} from '../../../src/lib/fit';
import { expectAbs, expectRel } from './helpers';

const db = (v: number) => -10 * Math.log10(v);

describe('physics.md A5 check values (squeezing; Collett & Gardiner, PRA 30, 1386 (1984); Polzik et al., Appl. Phys. B 55, 279 (1992) [M])', () => {
  test('A5.1 η = 0.90, V_initial → 0: S_max = 10.000 dB — common practice; [D] form 5.3', () => {
    expectAbs(maxSqueezingDb({ efficiency: 0.9 }).squeezingDb, 10, 0.001);
  });

  test('A5.2 records 15 dB (2016), 10 dB (2008), 12.3 dB (2011) need η ≥ 0.96838, 0.90000, 0.94112 — Vahlbruch, Mehmet, Danzmann, Schnabel, PRL 117, 110801 (2016) [C]; Vahlbruch et al., PRL 100, 033602 (2008) [C]; Mehmet et al., Opt. Express 19, 25763 (2011) [C]; bounds [D]', () => {
    expectRel(requiredEfficiency({ targetDb: 15 }).efficiency, 0.96838, 1e-4);
    expectRel(requiredEfficiency({ targetDb: 10 }).efficiency, 0.9, 1e-4);
    expectRel(requiredEfficiency({ targetDb: 12.3 }).efficiency, 0.94112, 1e-4);
  });

  test('A5.3 initial 20 dB, target 10 dB measured: η_req = 0.909091 — [D] form 5.4', () => {
    const r = requiredEfficiency({ targetDb: 10, initialDb: 20 });
    expect(r.feasible).toBe(true);
    expectRel(r.efficiency, 0.909091, 1e-5);
  });

  test('A5.4 pure 10 dB / 10 dB state, η = 0.90: measured −7.2125 dB / +9.5904 dB — [D] form 5.1', () => {
    expectAbs(db(lossyVariance({ variance: varianceFromDb(10), efficiency: 0.9 })), 7.2125, 0.001);
    expectAbs(-db(lossyVariance({ variance: varianceFromDb(-10), efficiency: 0.9 })), 9.5904, 0.001);
  });

  test('A5.5 clearance 20 dB and 10 dB (analyser convention): η_el = 0.99000, 0.90000 — common practice; [D]; Appel et al., PRA 75, 035802 (2007) [M]', () => {
    expectRel(electronicEfficiency({ clearanceDb: 20 }), 0.99, 1e-6);
    expectRel(electronicEfficiency({ clearanceDb: 10 }), 0.9, 1e-6);
  });

  test('A5.6 T_oc = 10 %, L_int = 0.2 %, η_prop = V_vis = η_QE = 0.99, clearance 20 dB: η_esc = 0.980392, η = 0.932343, S_max = 11.697 dB — [D] form 5.5', () => {
    const esc = escapeEfficiency({ outputCoupler: 0.1, internalLoss: 0.002 });
    expectRel(esc, 0.980392, 1e-5);
    const eta = totalEfficiency({
      escape: esc,
      propagation: 0.99,
      visibility: 0.99,
      quantumEfficiency: 0.99,
      electronic: electronicEfficiency({ clearanceDb: 20 }),
    });
    expectRel(eta, 0.932343, 1e-5);
    expectRel(maxSqueezingDb({ efficiency: eta }).squeezingDb, 11.697, 1e-5);
  });

  test('A5.7 OPO x = 0.5, Ω = 0, η = 1: V− = 0.111111 (9.5424 dB), V+ = 9.0000 — [D] form 5.6', () => {
    const q = opoQuadratures({ pumpParameter: 0.5, omegaOverGamma: 0, efficiency: 1 });
    expectRel(q.vMinus, 0.111111, 1e-5);
    expectRel(q.vPlus, 9, 1e-5);
    expectRel(q.squeezedDb, 9.5424, 1e-5);
    expectRel(q.antiSqueezedDb, 9.5424, 1e-5);
  });

  test('A5.8 OPO x = 0.5, Ω/γ_c = 1, η = 1: V− = 0.384615 (4.1497 dB), V+ = 2.6000 — [D] form 5.6', () => {
    const q = opoQuadratures({ pumpParameter: 0.5, omegaOverGamma: 1, efficiency: 1 });
    expectRel(q.vMinus, 0.384615, 1e-5);
    expectRel(q.squeezedDb, 4.1497, 1e-5);
    expectRel(q.vPlus, 2.6, 1e-5);
  });

  test('A5.9 OPO x = 0.5, Ω = 0, η = 0.90: V− = 0.20000 (6.9897 dB), V+ = 8.2000 (9.1381 dB) — [D]', () => {
    const q = opoQuadratures({ pumpParameter: 0.5, omegaOverGamma: 0, efficiency: 0.9 });
    expectRel(q.vMinus, 0.2, 1e-5);
    expectRel(q.squeezedDb, 6.9897, 1e-5);
    expectRel(q.vPlus, 8.2, 1e-5);
    expectRel(q.antiSqueezedDb, 9.1381, 1e-5);
  });

  test('A5.10 OPO x = 0.6, Ω = 0, η = 0.90, θ = 15 mrad fixed: 7.9730 dB / 11.6127 dB — [D] form 5.7', () => {
    const q = opoQuadratures({ pumpParameter: 0.6, omegaOverGamma: 0, efficiency: 0.9, phaseNoiseRad: 0.015 });
    expectAbs(q.squeezedDb, 7.973, 0.002);
    expectAbs(q.antiSqueezedDb, 11.6127, 0.002);
  });

  test('A5.11 LIGO H1 2018: NLG 3 → x = 0.422650, η = 0.70, θ = 50 mrad: model 3.710 / 6.570 dB (abs 0.005), measured 3.69 / 6.31 dB (±0.3); NLG 3.6 measured 3.97 / 7.56 dB (±0.3) — LIGO Hanford aLOG 43785 (2018) [C]; model [D]', () => {
    const x = 1 - 1 / Math.sqrt(3);
    expectRel(x, 0.42265, 1e-5);
    const q = opoQuadratures({ pumpParameter: x, omegaOverGamma: 0, efficiency: 0.7, phaseNoiseRad: 0.05 });
    expectAbs(q.squeezedDb, 3.71, 0.005);
    expectAbs(q.antiSqueezedDb, 6.57, 0.005);
    expectAbs(q.squeezedDb, 3.69, 0.3);
    expectAbs(q.antiSqueezedDb, 6.31, 0.3);
    const q36 = opoQuadratures({ pumpParameter: 1 - 1 / Math.sqrt(3.6), omegaOverGamma: 0, efficiency: 0.7, phaseNoiseRad: 0.05 });
    expectAbs(q36.squeezedDb, 3.97, 0.3);
    expectAbs(q36.antiSqueezedDb, 7.56, 0.3);
  });

  test('A5.12 η = 0.95 and 0.70, V_initial → 0: S_max = 13.0103 dB, 5.2288 dB — [D] form 5.3', () => {
    expectAbs(maxSqueezingDb({ efficiency: 0.95 }).squeezingDb, 13.0103, 0.001);
    expectAbs(maxSqueezingDb({ efficiency: 0.7 }).squeezingDb, 5.2288, 0.001);
  });

  test('A5.13 pure 13 dB / 13 dB, η = 0.80: −6.1962 dB / +12.0850 dB — [D] form 5.1', () => {
    expectAbs(db(lossyVariance({ variance: varianceFromDb(13), efficiency: 0.8 })), 6.1962, 0.001);
    expectAbs(-db(lossyVariance({ variance: varianceFromDb(-13), efficiency: 0.8 })), 12.085, 0.001);
  });

  test('A5.14 OPO x = 0.7, Ω/γ_c = 2, η = 0.90: V− = 0.634253 (1.9774 dB), V+ = 1.616137 (2.0848 dB) — [D] form 5.6', () => {
    const q = opoQuadratures({ pumpParameter: 0.7, omegaOverGamma: 2, efficiency: 0.9 });
    expectRel(q.vMinus, 0.634253, 1e-5);
    expectRel(q.vPlus, 1.616137, 1e-5);
    // The dB values are printed to 4 decimals (exact 1.97738, 2.08478), coarser than rel 1e-5: check them to their last digit.
    expectAbs(q.squeezedDb, 1.9774, 0.00005);
    expectAbs(q.antiSqueezedDb, 2.0848, 0.00005);
  });

  test('A5.15 10 mm PPKTP, 84 ppm/cm at 1550 nm, standing wave, T_oc = 10 %: L_int = 168 ppm, η_esc = 0.998323 — absorption from Steinlechner et al., Sensors 13, 565 (2013) [C]; [D]', () => {
    const internalLoss = 2 * 1.0 * 84e-6;
    expectRel(internalLoss, 168e-6, 1e-12);
    expectRel(escapeEfficiency({ outputCoupler: 0.1, internalLoss }), 0.998323, 1e-5);
  });
});

describe('physics.md A12.3 (squeezing goal chain)', () => {
  test('A12.3 initial 15 dB, goal 10 dB, η_esc = η_prop = 0.98, V_vis = 0.99, clearance 20 dB: η_req = 0.929390, η_QE,req = 0.997333 — [D] form 12.4', () => {
    const r = requiredDetectorEfficiency({
      targetDb: 10,
      initialDb: 15,
      escape: 0.98,
      propagation: 0.98,
      visibility: 0.99,
      clearanceDb: 20,
    });
    expect(r.feasible).toBe(true);
    expectRel(r.totalRequired, 0.92939, 1e-5);
    expectRel(r.efficiency, 0.997333, 1e-5);
  });

  test('required detector efficiency above 1 is flagged, not clipped', () => {
    const r = requiredDetectorEfficiency({
      targetDb: 12,
      initialDb: 15,
      escape: 0.98,
      propagation: 0.98,
      visibility: 0.99,
      clearanceDb: 20,
    });
    expect(r.feasible).toBe(false);
    expect(r.efficiency).toBeGreaterThan(1);
    expect(r.reason).toMatch(/above 1/);
  });

  test('OPO source: the required efficiency reproduces the OPO model at that efficiency', () => {
    const opo = { pumpParameter: 0.6, omegaOverGamma: 0.3 };
    const q = opoQuadratures({ ...opo, efficiency: 0.8, phaseNoiseRad: 0.02 });
    const r = requiredDetectorEfficiency({
      targetDb: q.squeezedDb,
      opo,
      phaseNoiseRad: 0.02,
      escape: 1,
      propagation: 1,
      visibility: 1,
      clearanceDb: 200,
    });
    expectRel(r.totalRequired, 0.8, 1e-9);
  });
});

describe('squeezing properties and edges', () => {
  test('with efficiency 1 the OPO state stays pure: V−·V+ = 1 at every Ω (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), (x, w) => {
        const q = opoQuadratures({ pumpParameter: x, omegaOverGamma: w, efficiency: 1 });
        expect(Math.abs(q.vMinus * q.vPlus - 1)).toBeLessThan(1e-9);
      }),
    );
  });

  test('loss only moves a variance toward shot noise (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), fc.double({ min: 1e-6, max: 1, noNaN: true }), (v, eta) => {
        const out = lossyVariance({ variance: v, efficiency: eta });
        expect(Math.abs(out - 1)).toBeLessThanOrEqual(Math.abs(v - 1) * (1 + 1e-12));
      }),
    );
  });

  test('η = 1 gives unbounded squeezing as a flag, not Infinity', () => {
    expect(maxSqueezingDb({ efficiency: 1 })).toEqual({ squeezingDb: null, unbounded: true });
  });

  test('a target beyond the initial squeezing is infeasible (required efficiency > 1)', () => {
    const r = requiredEfficiency({ targetDb: 12, initialDb: 10 });
    expect(r.feasible).toBe(false);
    expect(r.efficiency).toBeGreaterThan(1);
  });

  test('efficiency outside (0, 1] and pump at threshold throw FitInputError', () => {
    expect(() => lossyVariance({ variance: 0.1, efficiency: 0 })).toThrow(FitInputError);
    expect(() => lossyVariance({ variance: 0.1, efficiency: 1.01 })).toThrow(/efficiency/);
    expect(() => opoQuadratures({ pumpParameter: 1, omegaOverGamma: 0, efficiency: 0.9 })).toThrow(/pumpParameter/);
  });

  test('near threshold V− stays positive and finite (no cancellation to 0)', () => {
    const q = opoQuadratures({ pumpParameter: 1 - 1e-12, omegaOverGamma: 0, efficiency: 1 });
    expect(q.vMinus).toBeGreaterThan(0);
    expect(Number.isFinite(q.squeezedDb)).toBe(true);
  });

  test('optimumPump: with phase noise the best pump is below threshold; without, it runs to the scan limit (physics.md A5 assumptions)', () => {
    const noisy = optimumPump({ efficiency: 0.9, phaseNoiseRad: 0.015 });
    expect(noisy.pumpParameter).toBeGreaterThan(0.5);
    expect(noisy.pumpParameter).toBeLessThan(0.95);
    const here = opoQuadratures({
      pumpParameter: noisy.pumpParameter,
      omegaOverGamma: 0,
      efficiency: 0.9,
      phaseNoiseRad: 0.015,
    }).squeezedDb;
    expectRel(noisy.squeezedDb, here, 1e-12);
    for (const x of [noisy.pumpParameter - 0.02, noisy.pumpParameter + 0.02]) {
      expect(opoQuadratures({ pumpParameter: x, omegaOverGamma: 0, efficiency: 0.9, phaseNoiseRad: 0.015 }).squeezedDb).toBeLessThan(
        noisy.squeezedDb,
      );
    }
    expect(optimumPump({ efficiency: 0.9, phaseNoiseRad: 0 }).pumpParameter).toBeGreaterThan(0.999);
  });
});
