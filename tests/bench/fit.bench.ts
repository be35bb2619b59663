// Throughput of the goal evaluators on synthetic catalogues: evaluations per second of
// evaluateCavityGoal over 100 000 mirrors and of evaluateSqueezingGoal over 100 000 detectors.
// Run: npx tsx tests/bench/fit.bench.ts
import {
  bestPairs,
  evaluateCavityGoal,
  evaluateSqueezingGoal,
  type CavityGoal,
  type MirrorSpec,
  type PhotodiodeSpec,
  type SqueezingGoal,
} from '../../src/lib/fit';

const N = 100_000;

/** Deterministic PRNG (mulberry32) so every run sees the same catalogue. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const rand = rng(42);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)] as T;

const mirrors: MirrorSpec[] = Array.from({ length: N }, () => {
  const centre = pick([780, 852, 1064, 1550]);
  const m: MirrorSpec = {
    diameterMm: pick([12.7, 25.4]),
    substrate: 'fused silica',
    rocMm: pick([null, 50, 100, 250, 500, 1000]),
    designWavelengthNm: centre,
    bandMinNm: centre - 20 - Math.round(30 * rand()),
    bandMaxNm: centre + 20 + Math.round(30 * rand()),
    transmissionPpm: { value: 1 + 200 * rand(), tol: 5 * rand() },
    lossPpm: { value: 0.5 + 20 * rand(), tol: 2 * rand() },
    aoiDeg: 0,
    roughnessNm: 0.05 + 0.3 * rand(),
  };
  const r = rand();
  if (r < 0.1) {
    m.spectrum = {
      points: Array.from({ length: 50 }, (_, i) => ({
        wavelengthNm: centre - 50 + 2 * i,
        transmissionPpm: 1 + 200 * rand(),
        lossPpm: 1 + 10 * rand(),
      })),
    };
  } else if (r < 0.15) {
    m.ringdown = { wavelengthNm: centre, lengthM: 0.1, tauS: 1e-6 + 50e-6 * rand() };
  }
  return m;
});

const detectors: PhotodiodeSpec[] = Array.from({ length: N }, () => {
  const d: PhotodiodeSpec = {
    material: 'InGaAs',
    bandwidthHz: pick([10e6, 50e6, 100e6, 300e6]),
    saturationPowerW: pick([5e-3, 10e-3, 20e-3]),
    noiseCurrentAPerRtHz: { value: (1 + 10 * rand()) * 1e-12, tol: 1e-12 * rand() },
  };
  const r = rand();
  if (r < 0.2) d.qeCurve = Array.from({ length: 30 }, (_, i) => ({ wavelengthNm: 900 + 25 * i, qe: 0.8 + 0.19 * rand() }));
  else if (r < 0.6) Object.assign(d, { quantumEfficiency: { value: 0.9 + 0.099 * rand(), tol: 0.01 * rand() }, wavelengthNm: 1550 });
  else Object.assign(d, { responsivityAW: { value: 1.1 + 0.14 * rand(), tol: 0.01 }, wavelengthNm: 1550 });
  return d;
});

const cavityGoal: CavityGoal = { wavelengthNm: 1064, lengthM: 0.05, target: { kind: 'finesse', value: 30_000 }, configuration: 'pair' };
const pairGoal: CavityGoal = { ...cavityGoal, configuration: 'two-listings' };
const squeezingGoal: SqueezingGoal = {
  wavelengthNm: 1550,
  targetDb: 10,
  sidebandHz: 5e6,
  source: { kind: 'opo', pumpParameter: 0.8, linewidthHz: 60e6 },
  escapeEfficiency: 0.98,
  propagationEfficiency: 0.98,
  visibility: 0.99,
  loPowerW: 5e-3,
  phaseNoiseRad: 0.005,
};

interface Row {
  case: string;
  evaluations: number;
  'total ms': string;
  'evaluations/s': string;
  fits: number;
}

function run(name: string, count: number, once: (i: number) => boolean): Row {
  for (let i = 0; i < Math.min(count, 10_000); i++) once(i);
  const t0 = performance.now();
  let fits = 0;
  for (let i = 0; i < count; i++) if (once(i)) fits++;
  const ms = performance.now() - t0;
  return {
    case: name,
    evaluations: count,
    'total ms': ms.toFixed(1),
    'evaluations/s': Math.round((count / ms) * 1000).toLocaleString('en-US'),
    fits,
  };
}

const rows: Row[] = [
  run('evaluateCavityGoal (pair, 1064 nm, 50 mm)', N, (i) => evaluateCavityGoal(cavityGoal, mirrors[i] as MirrorSpec).pass),
  run(
    'evaluateCavityGoal (two-listings, neighbours)',
    N,
    (i) => evaluateCavityGoal(pairGoal, mirrors[i] as MirrorSpec, mirrors[(i + 1) % N] as MirrorSpec).pass,
  ),
  run('evaluateSqueezingGoal (OPO, 10 dB at 1550 nm)', N, (i) => evaluateSqueezingGoal(squeezingGoal, detectors[i] as PhotodiodeSpec).pass),
];

const t0 = performance.now();
const top = bestPairs(pairGoal, mirrors, 10);
const pairsMs = performance.now() - t0;

console.table(rows);
console.log(
  `bestPairs over ${N.toLocaleString('en-US')} mirrors (k = 10): ${pairsMs.toFixed(1)} ms; best worst-case finesse ${Math.round(top[0]?.result.finesse?.worst ?? 0)}`,
);
