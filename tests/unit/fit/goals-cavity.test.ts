import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  cqed,
  evaluateCavityGoal,
  finesse,
  freeSpectralRange,
  gaussianMode,
  lossFromRingdown,
  type CavityGoal,
  type MirrorSpec,
} from '../../../src/lib/fit';
import { expectRel } from './helpers';

const mirror = (over: Partial<MirrorSpec> = {}): MirrorSpec => ({
  diameterMm: 25.4,
  substrate: 'fused silica',
  rocMm: 1000,
  designWavelengthNm: 780,
  bandMinNm: 760,
  bandMaxNm: 800,
  transmissionPpm: { value: 10, tol: 2 },
  lossPpm: { value: 5, tol: 2 },
  aoiDeg: 0,
  ...over,
});

const goal = (over: Partial<CavityGoal> = {}): CavityGoal => ({
  wavelengthNm: 780,
  lengthM: 0.05,
  target: { kind: 'finesse', value: 1e5 },
  configuration: 'pair',
  ...over,
});

/** Form 1.3 with R = 1 − T − loss for both mirrors (physics.md A1). */
const form13 = (total1Ppm: number, total2Ppm: number, extraLossPpm = 0) =>
  finesse({ r1: 1 - total1Ppm * 1e-6, r2: 1 - total2Ppm * 1e-6, extraLoss: extraLossPpm * 1e-6 });

describe('evaluateCavityGoal verdicts (product goal semantics)', () => {
  test('fits: the worst case (T and loss at +tol) meets the goal; headroom = worst/goal − 1', () => {
    const r = evaluateCavityGoal(goal(), mirror());
    expect(r.verdict).toBe('fits');
    expect(r.pass).toBe(true);
    expectRel(r.figure, form13(15, 15), 1e-9);
    expectRel(r.worst, form13(19, 19), 1e-9);
    expectRel(r.headroom, form13(19, 19) / 1e5 - 1, 1e-9);
    expect(r.reasons).toEqual([]);
    expect(r.unit).toBe('');
    expect(r.formula).toMatch(/π·ρ\^¼/);
    expect(r.source).toMatch(/Hecht/);
  });

  test('marginal: only the nominal meets the goal', () => {
    const r = evaluateCavityGoal(goal({ target: { kind: 'finesse', value: 2e5 } }), mirror());
    expect(r.verdict).toBe('marginal');
    expect(r.pass).toBe(false);
    expect(r.headroom).toBeLessThan(0);
    expect(r.reasons[0]).toMatch(/worst case finesse .* misses the goal/);
  });

  test('does-not-fit: even the nominal misses', () => {
    const r = evaluateCavityGoal(goal({ target: { kind: 'finesse', value: 5e5 } }), mirror());
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons[0]).toMatch(/finesse .* misses the goal finesse/);
  });

  test('linewidth goal: figure in Hz, less is better, headroom goal/worst − 1 equals the finesse headroom', () => {
    const fsr = freeSpectralRange({ lengthM: 0.05 });
    const hz = fsr / 1e5;
    const r = evaluateCavityGoal(goal({ target: { kind: 'linewidth', hz } }), mirror());
    expect(r.unit).toBe('Hz');
    expectRel(r.goalFinesse, 1e5, 1e-12);
    expectRel(r.figure, fsr / form13(15, 15), 1e-9);
    expectRel(r.headroom, hz / (fsr / form13(19, 19)) - 1, 1e-9);
    expectRel(r.headroom, evaluateCavityGoal(goal(), mirror()).headroom as number, 1e-9);
  });

  test('storage-time goal becomes 2π·FSR·τ', () => {
    const fsr = freeSpectralRange({ lengthM: 0.05 });
    const r = evaluateCavityGoal(goal({ target: { kind: 'storage-time', s: 5e-6 } }), mirror());
    expect(r.unit).toBe('s');
    expectRel(r.goalFinesse, 2 * Math.PI * fsr * 5e-6, 1e-12);
    expectRel(r.figure, form13(15, 15) / (2 * Math.PI * fsr), 1e-9);
  });

  test('extra round-trip loss enters form 1.3', () => {
    const r = evaluateCavityGoal(goal({ extraLossPpm: 20 }), mirror());
    expectRel(r.figure, form13(15, 15, 20), 1e-9);
  });

  test('figure equals form 1.3 for random T and loss (fast-check)', () => {
    const ppm = fc.double({ min: 0.1, max: 5000, noNaN: true });
    fc.assert(
      fc.property(ppm, ppm, ppm, ppm, (t1, a1, t2, a2) => {
        const r = evaluateCavityGoal(
          goal({ configuration: 'two-listings' }),
          mirror({ transmissionPpm: { value: t1 }, lossPpm: { value: a1 } }),
          mirror({ transmissionPpm: { value: t2 }, lossPpm: { value: a2 } }),
        );
        expectRel(r.figure, form13(t1 + a1, t2 + a2), 1e-6);
        expect(r.worst).toBe(r.figure);
      }),
    );
  });
});

describe('evaluateCavityGoal worst case (physics.md A12 form 12.5)', () => {
  test('worst ≤ nominal ≤ best finesse, and the linewidth worst case is the widest (fast-check)', () => {
    const ppm = fc.double({ min: 0.1, max: 5000, noNaN: true });
    const tolPpm = fc.double({ min: 0, max: 100, noNaN: true });
    fc.assert(
      fc.property(ppm, tolPpm, ppm, tolPpm, (t, tt, a, ta) => {
        const m = mirror({ transmissionPpm: { value: t, tol: tt }, lossPpm: { value: a, tol: ta } });
        const r = evaluateCavityGoal(goal({ target: { kind: 'linewidth', hz: 1e4 } }), m);
        const f = r.finesse as { nominal: number; worst: number; best: number | null };
        expect(f.worst).toBeLessThanOrEqual(f.nominal);
        if (f.best !== null) expect(f.nominal).toBeLessThanOrEqual(f.best);
        expect(r.worst as number).toBeGreaterThanOrEqual(r.figure as number);
      }),
    );
  });
});

describe('evaluateCavityGoal reasons', () => {
  test('out of band: "coating band 1020–1100 nm does not cover 780 nm"', () => {
    const r = evaluateCavityGoal(goal(), mirror({ bandMinNm: 1020, bandMaxNm: 1100 }));
    expect(r.verdict).toBe('does-not-fit');
    expect(r.figure).toBeNull();
    expect(r.headroom).toBeNull();
    expect(r.reasons.join(' ')).toContain('coating band 1020–1100 nm does not cover 780 nm');
  });

  test('unstable: "unstable: g1·g2 = 1.96 for 120 mm with these radii"', () => {
    const r = evaluateCavityGoal(goal({ lengthM: 0.12 }), mirror({ rocMm: 50 }));
    expect(r.verdict).toBe('does-not-fit');
    expect(r.stable).toBe(false);
    expect(r.headroom).toBeNull();
    expect(r.reasons).toContain('unstable: g1·g2 = 1.96 for 120 mm with these radii');
    expect(r.waistM).toBeNull();
  });

  test('plane–plane pair is marginally stable: no Gaussian mode, does not fit', () => {
    const r = evaluateCavityGoal(goal(), mirror({ rocMm: null }));
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons[0]).toMatch(/marginally stable: g1·g2 = 1\.00/);
  });

  test('a 45° coating cannot serve a linear cavity', () => {
    const r = evaluateCavityGoal(goal(), mirror({ aoiDeg: 45 }));
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons[0]).toMatch(/45° incidence/);
  });

  test('mode details: waist, g-parameters and spot sizes from Kogelnik & Li', () => {
    const r = evaluateCavityGoal(goal(), mirror());
    const m = gaussianMode({ lengthM: 0.05, roc1M: 1, roc2M: 1, wavelengthM: 780e-9 });
    expect(r.g1g2).toBeCloseTo(0.9025, 12);
    expect(r.waistM).toBe(m.w0M);
    expect(r.spotOnMirror1M).toBe(m.w1M);
  });

  test('roughness well above the stated loss leaves a note, not a failure', () => {
    const r = evaluateCavityGoal(goal(), mirror({ roughnessNm: 1 }));
    expect(r.verdict).toBe('fits');
    expect(r.notes.join(' ')).toMatch(/roughness 1 nm rms implies about .* ppm scatter/);
  });
});

describe('evaluateCavityGoal measurements', () => {
  test('a ring-down at the wavelength replaces T + loss (form 1.10) and has no tolerance', () => {
    const ringdown = { wavelengthNm: 780.3, lengthM: 0.1, tauS: 50e-6 };
    const perMirrorPpm = lossFromRingdown(ringdown).perMirrorLoss * 1e6;
    const r = evaluateCavityGoal(goal(), mirror({ ringdown }));
    expect(r.mirrors[0]?.source).toBe('ring-down');
    expectRel(r.mirrors[0]?.totalPpm, perMirrorPpm, 1e-12);
    expectRel(r.figure, form13(perMirrorPpm, perMirrorPpm), 1e-9);
    expect(r.worst).toBe(r.figure);
    expect(r.notes.join(' ')).toMatch(/ring-down/);
  });

  test('a ring-down more than 1 nm away is not used; the ring-down also rescues a wavelength outside the band', () => {
    const far = evaluateCavityGoal(goal(), mirror({ ringdown: { wavelengthNm: 790, lengthM: 0.1, tauS: 50e-6 } }));
    expect(far.mirrors[0]?.source).toBe('spec');
    const outside = evaluateCavityGoal(goal({ wavelengthNm: 852 }), mirror({ ringdown: { wavelengthNm: 852, lengthM: 0.1, tauS: 50e-6 } }));
    expect(outside.mirrors[0]?.source).toBe('ring-down');
  });

  test('a measured spectrum is interpolated linearly inside its range; loss from the spec when not measured', () => {
    const spectrum = {
      points: [
        { wavelengthNm: 790, transmissionPpm: 40 },
        { wavelengthNm: 770, transmissionPpm: 20 },
      ],
    };
    const r = evaluateCavityGoal(goal(), mirror({ spectrum }));
    expect(r.mirrors[0]?.source).toBe('spectrum');
    expect(r.mirrors[0]?.transmissionPpm).toBeCloseTo(30, 12);
    expectRel(r.figure, form13(35, 35), 1e-9);
    expectRel(r.worst, form13(37, 37), 1e-9);
  });

  test('measured loss values are interpolated too', () => {
    const spectrum = {
      points: [
        { wavelengthNm: 770, transmissionPpm: 20, lossPpm: 2 },
        { wavelengthNm: 790, transmissionPpm: 40, lossPpm: 6 },
      ],
    };
    const r = evaluateCavityGoal(goal(), mirror({ spectrum }));
    expect(r.mirrors[0]?.lossPpm).toBeCloseTo(4, 12);
    expect(r.worst).toBe(r.figure);
  });

  test('no extrapolation: outside the spectrum the spec applies inside the band, else out of band', () => {
    const spectrum = {
      points: [
        { wavelengthNm: 700, transmissionPpm: 5 },
        { wavelengthNm: 720, transmissionPpm: 6 },
      ],
    };
    expect(evaluateCavityGoal(goal(), mirror({ spectrum })).mirrors[0]?.source).toBe('spec');
    const out = evaluateCavityGoal(goal(), mirror({ spectrum, bandMinNm: 1020, bandMaxNm: 1100 }));
    expect(out.verdict).toBe('does-not-fit');
    expect(out.reasons[0]).toContain('measured spectrum (700–720 nm)');
    const inside = evaluateCavityGoal(goal({ wavelengthNm: 710 }), mirror({ spectrum, bandMinNm: 1020, bandMaxNm: 1100 }));
    expect(inside.mirrors[0]?.source).toBe('spectrum');
  });
});

describe('evaluateCavityGoal configurations', () => {
  test('with-own-mirror: the buyer’s mirror (R or T + loss) is mirror 1', () => {
    const byR = evaluateCavityGoal(goal({ configuration: 'with-own-mirror', ownMirror: { reflectivity: 0.99999, rocMm: null } }), mirror());
    expect(byR.mirrors[0]?.source).toBe('own');
    expectRel(byR.figure, form13(10, 15), 1e-6);
    const byT = evaluateCavityGoal(
      goal({ configuration: 'with-own-mirror', ownMirror: { transmissionPpm: 8, lossPpm: 2, rocMm: 500 } }),
      mirror(),
    );
    expectRel(byT.figure, form13(10, 15), 1e-9);
    expect(byT.worst).toBeLessThan(byT.figure as number);
  });

  test('two-listings pairs two specs; missing or extra mirrors throw', () => {
    const r = evaluateCavityGoal(goal({ configuration: 'two-listings' }), mirror(), mirror({ transmissionPpm: { value: 30 }, rocMm: 500 }));
    expectRel(r.figure, form13(15, 35), 1e-9);
    expect(() => evaluateCavityGoal(goal({ configuration: 'two-listings' }), mirror())).toThrow(/mirrorB/);
    expect(() => evaluateCavityGoal(goal(), mirror(), mirror())).toThrow(FitInputError);
    expect(() => evaluateCavityGoal(goal({ configuration: 'with-own-mirror' }), mirror())).toThrow(/ownMirror/);
  });

  test('an atom line adds the cooperativity at the waist (A4 forms 4.3–4.5)', () => {
    const atom = { wavelengthNm: 780.241, gammaHz: 6.0666e6 };
    const r = evaluateCavityGoal(goal({ atom }), mirror());
    const m = gaussianMode({ lengthM: 0.05, roc1M: 1, roc2M: 1, wavelengthM: 780.241e-9 });
    const q = cqed({
      wavelengthM: 780.241e-9,
      gammaHz: 6.0666e6,
      lengthM: 0.05,
      waistM: m.w0M as number,
      finesse: r.finesse?.nominal as number,
    });
    expectRel(r.cooperativity?.c1, q.c1, 1e-12);
    expectRel(r.cooperativity?.eta, 2 * q.c1, 1e-12);
  });

  test('invalid specs throw FitInputError naming the field', () => {
    expect(() => evaluateCavityGoal(goal(), mirror({ transmissionPpm: { value: -1 } }))).toThrow(/mirrorA\.transmissionPpm\.value/);
    expect(() => evaluateCavityGoal(goal({ lengthM: -1 }), mirror())).toThrow(/goal\.lengthM/);
    expect(() => evaluateCavityGoal(goal(), mirror({ rocMm: 0 }))).toThrow(/rocMm/);
    expect(() => evaluateCavityGoal(goal(), mirror({ bandMinNm: 900 }))).toThrow(/bandMinNm/);
    expect(() => evaluateCavityGoal(goal({ target: { kind: 'finesse', value: Number.NaN } }), mirror())).toThrow(FitInputError);
  });

  test('T + loss of 0 ppm on both mirrors with no extra loss refuses (unbounded finesse)', () => {
    expect(() => evaluateCavityGoal(goal(), mirror({ transmissionPpm: { value: 0 }, lossPpm: { value: 0 } }))).toThrow(FitInputError);
    const best = evaluateCavityGoal(goal(), mirror({ transmissionPpm: { value: 1, tol: 1 }, lossPpm: { value: 1, tol: 1 } }));
    expect(best.finesse?.best).toBeNull();
  });
});
