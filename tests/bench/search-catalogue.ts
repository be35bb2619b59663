/**
 * A synthetic catalogue for the search benchmark, written into a real libSQL file through Drizzle:
 * invented labs and listings in the shares a busy exchange might hold (a third mirrors), specs in the
 * stored form the listing API writes, and measurement files (spectra, ring-downs, efficiency curves)
 * on about one listing in eight. Deterministic: the same rows on every run.
 */
import { getDb } from '../../src/server/db/client';
import { labs, listingFiles, listings, type PublishedListing } from '../../src/server/db/schema';
import type { Category, Condition, Region } from '../../src/lib/listings/constants';

/** mulberry32: a small seeded generator so every run sees the same catalogue. */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const LINES = [532, 633, 698, 780, 813, 852, 1064, 1310, 1550, 2000];
const DETECTOR_LINES = [780, 852, 1064, 1310, 1550];
const SHARES: [Category, number][] = [
  ['cavity-mirror', 0.35],
  ['photodiode', 0.1],
  ['balanced-detector', 0.1],
  ['single-photon-detector', 0.1],
  ['laser', 0.12],
  ['nonlinear-crystal', 0.08],
  ['other', 0.15],
];
const CONDITIONS: Condition[] = ['new', 'like-new', 'used-tested', 'used-untested', 'for-parts'];
const REGION_SETS: Region[][] = [['WORLD'], ['EU', 'UK'], ['EU', 'UK', 'US'], ['US', 'CA'], ['APAC'], ['EU']];
const WORDS = [
  'Stored in cleanroom packaging',
  'from a finished experiment',
  'tested last month',
  'with the original test report',
  'never mounted',
  'small edge chip outside the clear aperture',
  'ships in a nitrogen-purged box',
  'spare from a coating run',
];

interface Generated {
  category: Category;
  title: string;
  description: string;
  specs: Record<string, unknown>;
  measurement: Record<string, unknown> | null;
}

function pick<T>(rand: () => number, xs: readonly T[]): T {
  return xs[Math.floor(rand() * xs.length)] as T;
}

const r2 = (x: number) => Number(x.toFixed(2));

function mirror(rand: () => number): Generated {
  const wl = pick(rand, LINES);
  const half = Math.round(wl * (0.015 + 0.045 * rand()));
  const t = r2(1 + 200 * rand() ** 2);
  const loss = r2(0.5 + 20 * rand() ** 2);
  const roc = pick(rand, [25, 50, 100, 250, 500, 1000, null]);
  const specs = {
    diameterMm: pick(rand, [7.75, 12.7, 25.4]),
    substrate: pick(rand, ['fused silica', 'ULE', 'silicon']),
    rocMm: roc,
    designWavelengthNm: wl,
    bandMinNm: wl - half,
    bandMaxNm: wl + half,
    transmissionPpm: { value: t, tol: r2(t * 0.2) },
    lossPpm: { value: loss, tol: r2(loss * 0.3) },
    aoiDeg: rand() < 0.05 ? 45 : 0,
    roughnessNm: r2(0.05 + 0.3 * rand()),
  };
  const m = rand();
  let measurement: Record<string, unknown> | null = null;
  if (m < 0.1) {
    measurement = {
      kind: 'spectrum',
      quantity: 'transmission-loss',
      derivedFromReflectance: false,
      notes: [],
      points: Array.from({ length: 41 }, (_, i) => {
        const x = (i - 20) / 20;
        return {
          wavelengthNm: r2(wl - half + (i * 2 * half) / 40),
          transmissionPpm: r2(t * (1 + 2 * x * x)),
          lossPpm: r2(loss * (1 + 0.05 * rand())),
        };
      }),
    };
  } else if (m < 0.15) {
    const perMirror = (t + loss) * 0.9;
    measurement = {
      kind: 'ringdown',
      notes: [],
      points: [],
      lengthM: 0.05,
      wavelengthNm: wl,
      groupIndex: null,
      figures: null,
      fit: { tauS: 0.05 / (299_792_458 * perMirror * 1e-6) },
    };
  }
  const pair = rand() < 0.5;
  return {
    category: 'cavity-mirror',
    title: `${pair ? 'Matched pair of ' : ''}${wl} nm ${t < 10 ? 'supermirror' : 'low-loss mirror'}${pair ? 's' : ''}, ${roc ? `ROC ${roc} mm` : 'flat'}`,
    description: `Ion-beam-sputtered coating, ${pick(rand, WORDS)}.`,
    specs,
    measurement,
  };
}

function detector(rand: () => number, category: 'photodiode' | 'balanced-detector'): Generated {
  const wl = pick(rand, DETECTOR_LINES);
  const material = wl > 1000 ? 'InGaAs' : 'Si';
  const qe = r2(0.7 + 0.29 * rand());
  const specs: Record<string, unknown> = {
    material,
    activeDiameterMm: pick(rand, [0.3, 0.5, 1, 3]),
    wavelengthNm: wl,
    quantumEfficiency: { value: qe, tol: 0.01 },
    bandwidthHz: pick(rand, [10e6, 50e6, 100e6, 300e6, 1e9]),
    darkCurrentA: 1e-9,
    capacitanceF: 5e-12,
    saturationPowerW: pick(rand, [5e-3, 10e-3, 20e-3]),
    noiseCurrentAPerRtHz: { value: r2(1 + 10 * rand()) * 1e-12, tol: 0.5e-12 },
    ...(category === 'balanced-detector' ? { cmrrDb: 30 } : {}),
  };
  const measurement =
    rand() < 0.2
      ? {
          kind: 'efficiency-curve',
          notes: [],
          points: Array.from({ length: 31 }, (_, i) => ({
            wavelengthNm: wl - 150 + 10 * i,
            efficiency: Math.min(0.999, qe * (1 - 0.3 * ((i - 15) / 15) ** 2)),
          })),
        }
      : null;
  return {
    category,
    title:
      category === 'balanced-detector'
        ? `Balanced detector, ${wl} nm, ${Number(specs.bandwidthHz) / 1e6} MHz`
        : `${material} photodiode, ${specs.activeDiameterMm} mm, ${wl} nm`,
    description: `Detector from a squeezed-light source, ${pick(rand, WORDS)}.`,
    specs,
    measurement,
  };
}

function counter(rand: () => number): Generated {
  const wl = pick(rand, [780, 810, 1310, 1550]);
  const snspd = rand() < 0.4;
  return {
    category: 'single-photon-detector',
    title: snspd ? `Nanowire detector, ${wl} nm` : `SPAD module, ${wl} nm`,
    description: `System detection efficiency measured at ${wl} nm, ${pick(rand, WORDS)}.`,
    specs: {
      technology: snspd ? 'snspd' : 'si-spad',
      wavelengthNm: wl,
      efficiency: { value: r2(snspd ? 0.8 + 0.15 * rand() : 0.3 + 0.4 * rand()), tol: 0.02 },
      darkCountRateHz: { value: Math.round(10 + 500 * rand()), tol: 10 },
      jitterFwhmS: (snspd ? 30 : 300) * 1e-12,
      deadTimeS: (snspd ? 40 : 25) * 1e-9,
      afterpulsing: snspd ? 0 : 0.02,
      cooling: snspd ? 'cryocooler' : 'peltier',
    },
    measurement: null,
  };
}

function laser(rand: () => number): Generated {
  const wl = pick(rand, LINES);
  const span = r2(0.1 + 20 * rand());
  const lw = Math.round(100 + 1e6 * rand() ** 3);
  const power = r2(0.01 + 2 * rand());
  return {
    category: 'laser',
    title: `${wl} nm single-frequency laser, ${Math.round(power * 1000)} mW`,
    description: `Includes the controller, ${pick(rand, WORDS)}.`,
    specs: {
      type: 'ecdl',
      centreWavelengthNm: wl,
      tuningMinNm: wl - span,
      tuningMaxNm: wl + span,
      linewidthHz: { value: lw, tol: lw * 0.3 },
      linewidthTimeS: 1e-4,
      powerW: { value: power, tol: power * 0.05 },
      singleFrequency: true,
      fibreOutput: rand() < 0.5,
      hazardClass: '3B',
    },
    measurement: null,
  };
}

function crystal(rand: () => number): Generated {
  const signal = pick(rand, [810, 1064, 1550]);
  return {
    category: 'nonlinear-crystal',
    title: `PPKTP for ${signal / 2} → ${signal} nm`,
    description: `Type-0 crystal, ${pick(rand, WORDS)}.`,
    specs: {
      material: 'PPKTP',
      polingPeriodsUm: [r2(9 + 20 * rand())],
      phaseMatching: 'type-0',
      pumpWavelengthNm: signal / 2,
      signalWavelengthNm: signal,
      lengthMm: pick(rand, [10, 15, 20]),
      ovenIncluded: rand() < 0.5,
    },
    measurement: null,
  };
}

function other(rand: () => number): Generated {
  const wl = pick(rand, LINES);
  return {
    category: 'other',
    title: `Optical isolator, ${wl - 20}–${wl + 20} nm`,
    description: `Free-space isolator, ${pick(rand, WORDS)}.`,
    specs: {
      componentType: 'isolator',
      wavelengthMinNm: wl - 20,
      wavelengthMaxNm: wl + 20,
      apertureMm: 5,
      insertionLossDb: 0.8,
      isolationDb: 40,
    },
    measurement: null,
  };
}

function generate(rand: () => number): Generated {
  let u = rand();
  for (const [category, share] of SHARES) {
    u -= share;
    if (u > 0) continue;
    if (category === 'cavity-mirror') return mirror(rand);
    if (category === 'photodiode' || category === 'balanced-detector') return detector(rand, category);
    if (category === 'single-photon-detector') return counter(rand);
    if (category === 'laser') return laser(rand);
    if (category === 'nonlinear-crystal') return crystal(rand);
  }
  return other(rand);
}

const LAB_FIRST = ['Aurelian', 'Kestrel', 'Solvik', 'Marrow', 'Ostrava', 'Tidewell', 'Quillon', 'Brannock'];
const LAB_SECOND = ['Optics Group', 'Photonics Lab', 'Quantum Light Laboratory', 'Cavity Team', 'Precision Measurement Group'];
const LAB_COUNT = LAB_FIRST.length * LAB_SECOND.length;

/** Adds listings until the table holds `total`; the first call also creates the labs. */
export async function growCatalogue(total: number, rand: () => number): Promise<void> {
  const db = getDb();
  const labIds = (await db.select({ id: labs.id }).from(labs)).map((l) => l.id);
  if (labIds.length === 0) {
    const rows = Array.from({ length: LAB_COUNT }, (_, i) => ({
      id: `lab-${i}`,
      slug: `bench-lab-${i}`,
      name: `${LAB_FIRST[i % LAB_FIRST.length]} ${LAB_SECOND[Math.floor(i / LAB_FIRST.length)]}`,
      institute: 'Institute of Synthetic Optics',
      country: 'XX',
    }));
    await db.insert(labs).values(rows);
    labIds.push(...rows.map((r) => r.id));
  }
  const existing = (await db.$count(listings)) as number;
  const start = Date.UTC(2026, 0, 1);
  for (let from = existing; from < total; from += 500) {
    const batch = Array.from({ length: Math.min(500, total - from) }, (_, k) => ({ n: from + k, g: generate(rand) }));
    const currency = () => pick(rand, ['EUR', 'EUR', 'USD', 'GBP']);
    const rows = batch.map(({ n, g }) => {
      const priceCents = Math.round(100 + 30_000 * rand() ** 2) * 100;
      const cur = currency();
      const published: PublishedListing = {
        title: g.title,
        description: g.description,
        condition: pick(rand, CONDITIONS),
        priceCents,
        currency: cur,
        shipsTo: pick(rand, REGION_SETS),
        specs: g.specs,
        approvedAt: start + n * 60_000,
      };
      return {
        id: `bench-${n}`,
        labId: labIds[n % labIds.length] as string,
        category: g.category,
        status: 'live' as const,
        title: g.title,
        description: g.description,
        condition: published.condition,
        quantity: 1 + Math.floor(rand() * 4),
        priceCents,
        currency: cur,
        shipsTo: published.shipsTo,
        specs: g.specs,
        published,
      };
    });
    const files = batch.flatMap(({ n, g }) =>
      g.measurement === null
        ? []
        : [
            {
              id: `bench-file-${n}`,
              listingId: `bench-${n}`,
              kind: 'measurement' as const,
              measurementKind: g.measurement.kind as 'spectrum',
              filename: 'm.csv',
              contentType: 'text/csv',
              size: 1000,
              storageKey: `bench/${n}`,
              status: 'ready' as const,
              data: g.measurement,
            },
          ],
    );
    await db.transaction(async (tx) => {
      await tx.insert(listings).values(rows);
      if (files.length) await tx.insert(listingFiles).values(files);
    });
  }
}
