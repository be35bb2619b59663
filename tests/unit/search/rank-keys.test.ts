// The search ranks listings with fast readings and keys (src/server/search/goals/*) that must agree
// with the fit engine's evaluators on every catalogue: compared here over random mirrors (specs,
// spectra, ring-downs, oblique coatings), detectors (QE, responsivity, curves, noise or NEP or
// none) and goals. A key is the verdict's rank and the worst-case headroom.
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import {
  bestPairs,
  evaluateCavityGoal,
  evaluateSqueezingGoal,
  FitInputError,
  interpolateCurve,
  mirrorAtWavelength,
  type CavityGoal,
  type GoalResult,
  type MirrorSpec,
  type PhotodiodeSpec,
  type SqueezingGoal,
} from '../../../src/lib/fit';
import type { SearchDoc } from '../../../src/server/search/documents';
import { bestTwoListingPairs, cavityKey, cavityQuery, type MirrorPrep } from '../../../src/server/search/goals/cavity';
import { lerpSorted } from '../../../src/server/search/goals/lerp';
import { mirrorAt, prepare } from '../../../src/server/search/goals/prepare';
import { VERDICT_RANK, type RankKey } from '../../../src/server/search/goals/rank';
import { squeezingKey, squeezingQuery, type DetectorPrep } from '../../../src/server/search/goals/squeezing';

const C = 299_792_458;

const double = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

const mirrorArb: fc.Arbitrary<MirrorSpec> = fc
  .record({
    centre: fc.constantFrom(780, 852, 1064),
    half: fc.integer({ min: 5, max: 40 }),
    t: double(0.2, 400),
    tTol: double(0, 30),
    loss: double(0, 60),
    lossTol: double(0, 10),
    rocMm: fc.constantFrom<number | null>(null, 25, 50, 100, 250, 1000),
    aoiDeg: fc.constantFrom(0, 0, 0, 10),
    measured: fc.constantFrom('none', 'spectrum', 'spectrum-t-only', 'ringdown', 'both'),
    spectrum: fc.array(double(0.2, 500), { minLength: 11, maxLength: 11 }),
    spectrumLoss: fc.array(double(0, 40), { minLength: 11, maxLength: 11 }),
    ringdownOffsetNm: fc.constantFrom(0, 0.6, 3),
    ringdownPpm: double(2, 200),
  })
  .map((m) => {
    const spec: MirrorSpec = {
      diameterMm: 12.7,
      substrate: 'fused silica',
      rocMm: m.rocMm,
      designWavelengthNm: m.centre,
      bandMinNm: m.centre - m.half,
      bandMaxNm: m.centre + m.half,
      transmissionPpm: { value: m.t, tol: m.tTol },
      lossPpm: { value: m.loss, tol: m.lossTol },
      aoiDeg: m.aoiDeg,
    };
    if (m.measured.startsWith('spectrum') || m.measured === 'both') {
      // a measured range a little wider than the band, in reverse order, as files sometimes come
      spec.spectrum = {
        points: m.spectrum
          .map((t, i) => ({
            wavelengthNm: m.centre - m.half - 10 + (i * (2 * m.half + 20)) / 10,
            transmissionPpm: t,
            ...(m.measured === 'spectrum-t-only' ? {} : { lossPpm: m.spectrumLoss[i]! }),
          }))
          .reverse(),
      };
    }
    if (m.measured === 'ringdown' || m.measured === 'both') {
      spec.ringdown = { wavelengthNm: m.centre + m.ringdownOffsetNm, lengthM: 0.05, tauS: 0.05 / (C * m.ringdownPpm * 1e-6) };
    }
    return spec;
  });

const doc = (spec: MirrorSpec | PhotodiodeSpec, kind: 'mirror' | 'photodiode') => ({ candidate: { kind, spec } }) as unknown as SearchDoc;

/** What the engine says, as a key; a refused input ranks as "does not fit" without a headroom. */
function engineKey(run: () => GoalResult): RankKey {
  try {
    const r = run();
    return { rank: VERDICT_RANK[r.verdict], headroom: r.headroom };
  } catch (e) {
    if (e instanceof FitInputError) return { rank: 0, headroom: null };
    throw e;
  }
}

function expectSameKey(fast: RankKey, engine: RankKey) {
  expect(fast.rank).toBe(engine.rank);
  if (engine.headroom === null) expect(fast.headroom).toBeNull();
  else expect(fast.headroom).toBeCloseTo(engine.headroom, 12);
}

const wavelengthArb = fc.tuple(fc.constantFrom(780, 852, 1064), double(-60, 60)).map(([c, d]) => c + d);

const cavityGoalArb = (configuration: CavityGoal['configuration']): fc.Arbitrary<CavityGoal> =>
  fc
    .record({
      lengthM: double(0.01, 0.3),
      kind: fc.constantFrom('finesse', 'linewidth', 'storage-time'),
      finesse: double(1e3, 2e6),
      extraLossPpm: fc.constantFrom(0, 0, 15),
      own: fc.oneof(
        fc.record({ reflectivity: double(0.99, 0.999999), rocMm: fc.constantFrom<number | null>(null, 100, 500) }),
        fc.record({ transmissionPpm: double(0, 100), lossPpm: double(0, 20), rocMm: fc.constantFrom<number | null>(null, 100, 500) }),
      ),
    })
    .map((g) => {
      const fsr = C / (2 * g.lengthM);
      const target: CavityGoal['target'] =
        g.kind === 'finesse'
          ? { kind: 'finesse', value: g.finesse }
          : g.kind === 'linewidth'
            ? { kind: 'linewidth', hz: fsr / g.finesse }
            : { kind: 'storage-time', s: g.finesse / (2 * Math.PI * fsr) };
      return {
        wavelengthNm: 0,
        lengthM: g.lengthM,
        target,
        configuration,
        extraLossPpm: g.extraLossPpm,
        ...(configuration === 'with-own-mirror' ? { ownMirror: g.own } : {}),
      };
    });

describe('mirror readings (mirrorAt) equal mirrorAtWavelength', () => {
  test('at any wavelength, with specs, spectra and ring-downs', () => {
    fc.assert(
      fc.property(mirrorArb, wavelengthArb, (spec, nm) => {
        const prep = prepare(doc(spec, 'mirror')) as MirrorPrep;
        let expected: unknown;
        try {
          expected = mirrorAtWavelength(spec, nm).mirror;
        } catch (e) {
          if (!(e instanceof FitInputError)) throw e;
          expected = null;
        }
        expect(mirrorAt(prep, nm)).toEqual(expected);
      }),
      { numRuns: 2000 },
    );
  });

  test('lerpSorted is interpolateCurve on sorted points, outside the points included', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(double(100, 2000), { minLength: 1, maxLength: 20 }),
        fc.array(double(0, 1), { minLength: 20, maxLength: 20 }),
        double(50, 2100),
        (xs, ys, x) => {
          const points = xs.sort((a, b) => a - b).map((px, i) => ({ x: px, y: ys[i]! }));
          expect(lerpSorted(points, x)).toBe(interpolateCurve('p', points, x));
        },
      ),
    );
  });
});

describe('cavity rank keys equal evaluateCavityGoal', () => {
  for (const configuration of ['pair', 'with-own-mirror'] as const) {
    test(configuration, () => {
      fc.assert(
        fc.property(mirrorArb, wavelengthArb, cavityGoalArb(configuration), (spec, nm, g) => {
          const goal = { ...g, wavelengthNm: nm };
          const fast = cavityKey(cavityQuery(goal), prepare(doc(spec, 'mirror')) as MirrorPrep);
          expectSameKey(
            fast,
            engineKey(() => evaluateCavityGoal(goal, spec)),
          );
        }),
        { numRuns: 2000 },
      );
    });
  }

  test('a best case with next to no loss (an own mirror of 5e-324 ppm) is a finite verdict in both', () => {
    // found by the property above: the ppm value underflows to zero loss after scaling
    const spec: MirrorSpec = {
      diameterMm: 12.7,
      substrate: 'fused silica',
      rocMm: null,
      designWavelengthNm: 852,
      bandMinNm: 847,
      bandMaxNm: 857,
      transmissionPpm: { value: 0.2, tol: 0.2 },
      lossPpm: { value: 0, tol: 0 },
      aoiDeg: 0,
    };
    const goal: CavityGoal = {
      wavelengthNm: 852,
      lengthM: 0.01,
      target: { kind: 'finesse', value: 1000 },
      configuration: 'with-own-mirror',
      extraLossPpm: 0,
      ownMirror: { transmissionPpm: 0, lossPpm: 5e-324, rocMm: 100 },
    };
    const engine = evaluateCavityGoal(goal, spec);
    expect(engine.verdict).toBe('fits');
    expectSameKey(
      cavityKey(cavityQuery(goal), prepare(doc(spec, 'mirror')) as MirrorPrep),
      engineKey(() => engine),
    );
  });

  test('two listings: bestTwoListingPairs gives bestPairs’ pairs over every mirror', () => {
    fc.assert(
      fc.property(
        fc.array(mirrorArb, { minLength: 2, maxLength: 40 }),
        fc.constantFrom(780, 852),
        cavityGoalArb('two-listings'),
        fc.integer({ min: 1, max: 12 }),
        (specs, nm, g, k) => {
          const goal = { ...g, wavelengthNm: nm };
          const q = cavityQuery(goal);
          const mirrors = specs.map((s) => ({ prep: prepare(doc(s, 'mirror')) as MirrorPrep }));
          const usable = mirrors.flatMap((m, index) => {
            const reading = mirrorAt(m.prep, nm);
            return reading === null ? [] : [{ prep: m.prep, reading, index }];
          });
          const ours = bestTwoListingPairs(q, usable, k).map((p) => p.result.finesse?.worst);
          const reference = bestPairs(
            goal,
            usable.map((u) => u.prep.spec),
            k,
          ).map((p) => p.result.finesse?.worst);
          expect(ours).toEqual(reference);
        },
      ),
      { numRuns: 300 },
    );
  });
});

const detectorArb: fc.Arbitrary<PhotodiodeSpec> = fc
  .record({
    wl: fc.constantFrom(1064, 1550),
    qe: fc.oneof(fc.constant(null), fc.record({ value: double(0.5, 1), tol: double(0, 0.05) })),
    responsivity: fc.record({ value: double(0.5, 1.3), tol: double(0, 0.05) }),
    curve: fc.option(fc.array(double(0.5, 0.999), { minLength: 9, maxLength: 9 }), { nil: undefined }),
    noise: fc.constantFrom('current', 'nep', 'none'),
    noiseValue: double(0.5e-12, 20e-12),
    bandwidthHz: fc.constantFrom(1e6, 10e6, 100e6),
    saturationPowerW: fc.option(fc.constantFrom(1e-3, 5e-3, 20e-3), { nil: undefined }),
  })
  .map((d) => {
    const spec: PhotodiodeSpec = { material: 'InGaAs', wavelengthNm: d.wl, bandwidthHz: d.bandwidthHz };
    if (d.qe !== null) spec.quantumEfficiency = d.qe;
    else spec.responsivityAW = d.responsivity;
    if (d.curve) spec.qeCurve = d.curve.map((qe, i) => ({ wavelengthNm: d.wl - 200 + 50 * i, qe }));
    if (d.noise === 'current') spec.noiseCurrentAPerRtHz = { value: d.noiseValue, tol: d.noiseValue / 10 };
    if (d.noise === 'nep') spec.nepWPerRtHz = d.noiseValue;
    if (d.saturationPowerW !== undefined) spec.saturationPowerW = d.saturationPowerW;
    return spec;
  });

const squeezingGoalArb: fc.Arbitrary<SqueezingGoal> = fc.record({
  wavelengthNm: fc.tuple(fc.constantFrom(1064, 1550), fc.constantFrom(0, 0.5, 3, 120)).map(([c, d]) => c + d),
  targetDb: double(1, 15),
  sidebandHz: fc.constantFrom(1e6, 5e6, 30e6),
  source: fc.oneof(
    fc.record({ kind: fc.constant('initial' as const), initialDb: double(3, 20) }),
    fc.record({ kind: fc.constant('opo' as const), pumpParameter: double(0.1, 0.95), linewidthHz: double(10e6, 100e6) }),
  ),
  escapeEfficiency: double(0.8, 1),
  propagationEfficiency: double(0.8, 1),
  visibility: double(0.9, 1),
  loPowerW: double(0.5e-3, 10e-3),
  phaseNoiseRad: double(0, 0.05),
});

describe('squeezing rank keys equal evaluateSqueezingGoal', () => {
  test('over random detectors and loss budgets', () => {
    fc.assert(
      fc.property(detectorArb, squeezingGoalArb, (spec, goal) => {
        const fast = squeezingKey(squeezingQuery(goal), prepare(doc(spec, 'photodiode')) as DetectorPrep);
        expectSameKey(
          fast,
          engineKey(() => evaluateSqueezingGoal(goal, spec)),
        );
      }),
      { numRuns: 3000 },
    );
  });
});
