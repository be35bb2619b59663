/**
 * Demo listings of the invented labs: every category, most live, one waiting in the review queue.
 * Numbers are plausible for the trade, not copied from any product; brands are invented.
 */
import type { Category, Condition, Hazard, Region } from '../../lib/listings/constants';
import { ListingInputSchema } from '../../lib/specs';
import type { PublishedListing } from './schema';
import { buildListing } from './factories';
import { seededRandom } from './synthetic';

export interface DemoListing {
  lab: 'cavity' | 'squeezing' | 'startup';
  category: Category;
  title: string;
  description: string;
  condition: Condition;
  quantity: number;
  priceCents: number;
  currency: string;
  shipsTo: Region[];
  specs: Record<string, unknown>;
  hazards?: Hazard[];
  exportControlled?: boolean;
  exportNote?: string;
  inReview?: boolean;
  /** Synthetic measurement files the seed generates for this listing. */
  measurements?: ('ringdown' | 'spectrum' | 'efficiency-curve')[];
}

const round = (x: number, digits = 2) => Number(x.toFixed(digits));

function mirrors(rand: () => number): DemoListing[] {
  const lines: [number, number, number][] = [
    [780, 760, 800],
    [852, 830, 875],
    [1064, 1030, 1100],
    [1550, 1500, 1600],
    [698, 680, 715],
    [1064, 1040, 1090],
    [780, 770, 790],
    [852, 845, 860],
    [1550, 1520, 1580],
    [1064, 1000, 1120],
    [813, 790, 840],
    [1542, 1530, 1555],
    [780, 740, 820],
  ];
  return lines.map(([wl, lo, hi], i) => {
    const t = round(1 + rand() * 40, 1);
    const loss = round(0.8 + rand() * 6, 1);
    // the first pair is the one a buyer asking for finesse 100 000 at 780 nm in 5 cm finds
    const roc = i === 0 ? 100 : [25, 50, 100, 250, 500, 1000, null][i % 7]!;
    const lab = i % 3 === 2 ? 'squeezing' : 'cavity';
    const pair = i % 2 === 0;
    return {
      lab,
      category: 'cavity-mirror',
      title: `${pair ? 'Matched pair of ' : ''}${wl} nm ${t < 5 ? 'supermirror' : 'low-loss mirror'}${pair ? 's' : ''}, ${roc ? `ROC ${roc} mm` : 'flat'}`,
      description: `Ion-beam-sputtered coating on superpolished fused silica, from the same coating run as our science cavity. Stored in the original cleanroom packaging${
        i % 4 === 0 ? ', ring-down measured in our 5 cm test cavity' : ''
      }.`,
      condition: (['new', 'like-new', 'used-tested'] as const)[i % 3]!,
      quantity: pair ? 2 : 1 + (i % 3),
      priceCents: Math.round((600 + rand() * 2400) * (pair ? 2 : 1)) * 100,
      currency: i % 5 === 0 ? 'USD' : 'EUR',
      shipsTo: i % 4 === 0 ? ['WORLD'] : ['EU', 'UK', 'US'],
      specs: {
        diameterMm: i % 2 ? 12.7 : 7.75,
        thicknessMm: 4,
        substrate: 'fused silica',
        rocMm: roc,
        designWavelengthNm: wl,
        bandMinNm: lo,
        bandMaxNm: hi,
        transmissionPpm: { value: t, tol: round(t * 0.2, 2) },
        lossPpm: { value: loss, tol: round(loss * 0.3, 2) },
        aoiDeg: 0,
        roughnessNm: 0.1,
      },
      hazards: ['fragile'],
      measurements: i % 4 === 0 ? ['ringdown', 'spectrum'] : i % 3 === 0 ? ['spectrum'] : undefined,
    } satisfies DemoListing;
  });
}

function detectors(rand: () => number): DemoListing[] {
  const out: DemoListing[] = [];
  const items: [Category, string, number, string][] = [
    ['balanced-detector', 'Balanced homodyne detector, 1550 nm, 100 MHz', 1550, 'InGaAs'],
    ['balanced-detector', 'Low-noise balanced detector, 1064 nm, 20 MHz', 1064, 'InGaAs'],
    ['balanced-detector', 'Balanced detector with matched 99 % QE photodiodes, 1550 nm', 1550, 'InGaAs'],
    ['balanced-detector', 'Balanced detector, 852 nm, 50 MHz', 852, 'Si'],
    ['photodiode', 'High-QE InGaAs photodiodes, 500 µm, set of 4', 1550, 'InGaAs'],
    ['photodiode', 'Silicon photodiode, 3 mm, 1064 nm-optimised', 1064, 'Si'],
    ['photodiode', 'InGaAs photodiode pair, 1 mm, custom AR coating', 1550, 'InGaAs'],
    ['photodiode', 'Fast Si photodiode, 0.4 mm, 780 nm', 780, 'Si'],
    ['balanced-detector', 'Balanced detector for 1064 nm squeezing, 5 MHz sideband', 1064, 'InGaAs'],
  ];
  items.forEach(([category, title, wl, material], i) => {
    const qe = round(wl === 1550 ? 0.95 + rand() * 0.045 : 0.85 + rand() * 0.1, 3);
    out.push({
      lab: i % 2 ? 'startup' : 'squeezing',
      category,
      title,
      description: `${material} detector from our squeezed-light source. ${category === 'balanced-detector' ? 'Transimpedance amplifier tuned for the shot-noise clearance quoted below at a few mW of local oscillator.' : 'Unmounted, in a gel-pak.'}`,
      condition: (['used-tested', 'like-new', 'new'] as const)[i % 3]!,
      quantity: category === 'photodiode' ? 2 + (i % 3) : 1,
      priceCents: Math.round(300 + rand() * 3000) * 100,
      currency: 'EUR',
      shipsTo: ['EU', 'UK', 'US', 'CA'],
      specs: {
        material,
        activeDiameterMm: category === 'photodiode' ? [0.5, 3, 1, 0.4][i % 4]! : 0.5,
        wavelengthNm: wl,
        quantumEfficiency: { value: qe, tol: 0.01 },
        bandwidthHz: [100e6, 20e6, 150e6, 50e6, 300e6, 10e6, 250e6, 1e9, 30e6][i]!,
        darkCurrentA: 1e-9,
        capacitanceF: 5e-12 * (1 + (i % 3)),
        saturationPowerW: 10e-3 * (1 + (i % 2)),
        noiseCurrentAPerRtHz: { value: round(2 + rand() * 8, 1) * 1e-12, tol: 0.5e-12 },
        ...(category === 'balanced-detector' ? { cmrrDb: 30 + (i % 3) * 5 } : {}),
      },
      hazards: category === 'balanced-detector' ? ['high-voltage'] : [],
      measurements: i % 3 === 0 ? ['efficiency-curve'] : undefined,
    });
  });
  return out;
}

function counters(rand: () => number): DemoListing[] {
  const base = (
    tech: string,
    title: string,
    wl: number,
    eff: number,
    dark: number,
    jitter: number,
    dead: number,
    cooling: string,
  ): DemoListing => ({
    lab: 'startup',
    category: 'single-photon-detector',
    title,
    description: `System detection efficiency measured with a calibrated attenuator chain at ${wl} nm.${cooling === 'cryocooler' ? ' Comes with its closed-cycle cryostat and compressor.' : ''}`,
    condition: 'used-tested',
    quantity: 1,
    priceCents: Math.round((tech === 'snspd' ? 25000 : 2500) * (0.8 + rand() * 0.4)) * 100,
    currency: 'GBP',
    shipsTo: ['UK', 'EU'],
    specs: {
      technology: tech,
      wavelengthNm: wl,
      efficiency: { value: eff, tol: 0.02 },
      darkCountRateHz: { value: dark, tol: dark * 0.2 },
      jitterFwhmS: jitter,
      deadTimeS: dead,
      afterpulsing: tech === 'snspd' ? 0 : 0.02,
      cooling,
    },
    hazards: cooling === 'cryocooler' ? ['cryogenic', 'pressurised-gas', 'high-voltage'] : ['high-voltage'],
    exportControlled: tech === 'snspd',
    exportNote: tech === 'snspd' ? 'Dual-use review needed before export (seller to confirm classification).' : undefined,
    measurements: tech === 'snspd' ? ['efficiency-curve'] : undefined,
  });
  return [
    base('snspd', 'Superconducting nanowire detector system, 4 channels, 1550 nm', 1550, 0.9, 100, 35e-12, 40e-9, 'cryocooler'),
    base('snspd', 'Nanowire detector, single channel, 1310 nm optimised', 1310, 0.82, 50, 50e-12, 60e-9, 'cryocooler'),
    base('si-spad', 'Silicon SPAD module, 780 nm, 20 dark counts', 780, 0.68, 20, 350e-12, 22e-9, 'peltier'),
    base('si-spad', 'Thin silicon SPAD, low jitter, 810 nm', 810, 0.45, 250, 40e-12, 45e-9, 'peltier'),
    base('ingaas-spad', 'InGaAs/InP gated SPAD, 1550 nm', 1550, 0.25, 1500, 150e-12, 10e-6, 'peltier'),
    base('si-spad', 'Silicon SPAD array, 4 pixels, 650–850 nm', 810, 0.6, 100, 400e-12, 24e-9, 'peltier'),
  ];
}

function lasers(rand: () => number): DemoListing[] {
  const l = (
    title: string,
    type: string,
    wl: number,
    tmin: number | undefined,
    tmax: number | undefined,
    lw: number,
    p: number,
    cls: string,
    sf: boolean,
    fibre: boolean,
  ): DemoListing => ({
    lab: 'startup',
    category: 'laser',
    title,
    description: `Works; we moved to a different wavelength. Includes the controller and a short test report.`,
    condition: 'used-tested',
    quantity: 1,
    priceCents: Math.round(4000 + rand() * 20000) * 100,
    currency: 'EUR',
    shipsTo: ['EU', 'UK'],
    specs: {
      type,
      centreWavelengthNm: wl,
      ...(tmin !== undefined ? { tuningMinNm: tmin, tuningMaxNm: tmax } : {}),
      linewidthHz: { value: lw, tol: lw * 0.3 },
      linewidthTimeS: 100e-6,
      powerW: { value: p, tol: p * 0.05 },
      singleFrequency: sf,
      fibreOutput: fibre,
      m2: fibre ? 1.05 : 1.1,
      hazardClass: cls,
    },
    hazards: ['laser', 'high-voltage'],
  });
  return [
    l('1064 nm single-frequency fibre laser, 2 W, kHz linewidth', 'fibre', 1064, 1063.5, 1064.5, 5e3, 2, '4', true, true),
    l('780 nm external-cavity diode laser, 80 mW', 'ecdl', 780, 765, 795, 100e3, 0.08, '3B', true, false),
    l('852 nm DBR laser, 150 mW, mode-hop-free 30 GHz', 'dbr', 852, 851.8, 852.2, 1e6, 0.15, '3B', true, false),
    l('1550 nm narrow-linewidth fibre laser, 40 mW', 'fibre', 1550, 1549, 1551, 100, 0.04, '3B', true, true),
    l('Ti:sapphire ring laser, 700–1000 nm, 1.5 W', 'ti-sapphire', 813, 700, 1000, 50e3, 1.5, '4', true, false),
    l('1064 nm non-planar ring oscillator, 500 mW', 'solid-state', 1064, 1063.9, 1064.1, 1e3, 0.5, '3B', true, false),
    l('698 nm ECDL for clock spectroscopy, 30 mW', 'ecdl', 698, 690, 705, 200e3, 0.03, '3B', true, false),
  ];
}

function crystalsAndOther(): DemoListing[] {
  return [
    {
      lab: 'squeezing',
      category: 'nonlinear-crystal',
      title: 'PPKTP crystal for 775 → 1550 nm, 10 mm, with oven',
      description: 'Type-0 PPKTP from our squeezer; AR-coated for 775 and 1550 nm. Oven and controller included.',
      condition: 'used-tested',
      quantity: 1,
      priceCents: 240000,
      currency: 'EUR',
      shipsTo: ['EU', 'UK', 'US'],
      specs: {
        material: 'PPKTP',
        polingPeriodsUm: [24.7],
        phaseMatching: 'type-0',
        pumpWavelengthNm: 775,
        signalWavelengthNm: 1550,
        idlerWavelengthNm: 1550,
        lengthMm: 10,
        widthMm: 1,
        heightMm: 2,
        phaseMatchingTemperatureC: 62,
        coatings: 'AR 775/1550 nm both faces',
        ovenIncluded: true,
      },
      hazards: ['fragile'],
      inReview: false,
    },
    {
      lab: 'squeezing',
      category: 'nonlinear-crystal',
      title: 'PPKTP for 532 → 1064 nm, type-0, 15 mm',
      description: 'Spare crystal, never mounted.',
      condition: 'new',
      quantity: 2,
      priceCents: 180000,
      currency: 'EUR',
      shipsTo: ['EU'],
      specs: {
        material: 'PPKTP',
        polingPeriodsUm: [9.0],
        phaseMatching: 'type-0',
        pumpWavelengthNm: 532,
        signalWavelengthNm: 1064,
        lengthMm: 15,
        ovenIncluded: false,
      },
    },
    {
      lab: 'squeezing',
      category: 'nonlinear-crystal',
      title: 'Type-II PPKTP for 405 → 810 nm photon pairs',
      description: 'Used for a heralded single-photon source; slight edge chip outside the clear aperture.',
      condition: 'used-tested',
      quantity: 1,
      priceCents: 95000,
      currency: 'EUR',
      shipsTo: ['WORLD'],
      specs: {
        material: 'PPKTP',
        polingPeriodsUm: [10.0],
        phaseMatching: 'type-II',
        pumpWavelengthNm: 405,
        signalWavelengthNm: 810,
        lengthMm: 20,
        ovenIncluded: true,
      },
    },
    {
      lab: 'cavity',
      category: 'other',
      title: 'Fibre-coupled electro-optic phase modulator, 780 nm, 10 GHz',
      description: 'Low Vπ, PM fibre pigtails.',
      condition: 'like-new',
      quantity: 1,
      priceCents: 160000,
      currency: 'EUR',
      shipsTo: ['EU', 'UK'],
      specs: {
        componentType: 'electro-optic-modulator',
        wavelengthMinNm: 760,
        wavelengthMaxNm: 800,
        insertionLossDb: 3.5,
        halfWaveVoltageV: 3,
        bandwidthHz: 10e9,
      },
      hazards: ['high-voltage'],
    },
    {
      lab: 'cavity',
      category: 'other',
      title: 'Free-space optical isolator, 850–870 nm, 5 mm aperture',
      description: 'Two-stage, > 55 dB isolation.',
      condition: 'used-tested',
      quantity: 2,
      priceCents: 85000,
      currency: 'EUR',
      shipsTo: ['EU', 'UK', 'US'],
      specs: {
        componentType: 'isolator',
        wavelengthMinNm: 850,
        wavelengthMaxNm: 870,
        apertureMm: 5,
        insertionLossDb: 0.8,
        isolationDb: 55,
      },
    },
    {
      lab: 'startup',
      category: 'other',
      title: 'Zero-order half-wave plates, 1550 nm, set of 6',
      description: 'Quartz, 1/2" mounted.',
      condition: 'new',
      quantity: 6,
      priceCents: 12000,
      currency: 'GBP',
      shipsTo: ['WORLD'],
      specs: { componentType: 'wave-plate', wavelengthMinNm: 1540, wavelengthMaxNm: 1560, apertureMm: 10, retardanceWaves: 0.5 },
    },
    {
      lab: 'cavity',
      category: 'cavity-mirror',
      title: '852 nm supermirror pair for a cesium cavity, ROC 100 mm',
      description: 'Freshly coated pair; we would like a moderator to check the ring-down before it goes live.',
      condition: 'new',
      quantity: 2,
      priceCents: 320000,
      currency: 'EUR',
      shipsTo: ['EU', 'UK', 'US'],
      specs: {
        diameterMm: 7.75,
        substrate: 'fused silica',
        rocMm: 100,
        designWavelengthNm: 852,
        bandMinNm: 835,
        bandMaxNm: 870,
        transmissionPpm: { value: 3, tol: 0.5 },
        lossPpm: { value: 2, tol: 0.5 },
        aoiDeg: 0,
        roughnessNm: 0.08,
      },
      hazards: ['fragile'],
      inReview: true,
      measurements: ['ringdown'],
    },
  ];
}

export function demoListings(): DemoListing[] {
  const rand = seededRandom(20261201);
  return [...mirrors(rand), ...detectors(rand), ...counters(rand), ...lasers(rand), ...crystalsAndOther()];
}

/** Inserts the demo listings through the shared factory; each is validated by the API's own schema first. */
export async function seedListings(labIds: Record<DemoListing['lab'], string>, createdBy: Record<DemoListing['lab'], string>) {
  const created: { id: string; demo: DemoListing }[] = [];
  const start = Date.UTC(2026, 10, 1);
  for (const [i, d] of demoListings().entries()) {
    const parsed = ListingInputSchema.parse({
      category: d.category,
      title: d.title,
      description: d.description,
      condition: d.condition,
      quantity: d.quantity,
      priceCents: d.priceCents,
      currency: d.currency,
      shipsTo: d.shipsTo,
      specs: d.specs,
    });
    const approvedAt = start + i * 3600_000 * 7;
    const published: PublishedListing | null = d.inReview
      ? null
      : {
          title: parsed.title,
          description: parsed.description,
          condition: parsed.condition,
          priceCents: parsed.priceCents,
          currency: parsed.currency,
          shipsTo: parsed.shipsTo,
          specs: parsed.specs as Record<string, unknown>,
          approvedAt,
        };
    const { id } = await buildListing({
      labId: labIds[d.lab],
      createdBy: createdBy[d.lab],
      category: parsed.category,
      title: parsed.title,
      description: parsed.description,
      condition: parsed.condition,
      quantity: parsed.quantity,
      priceCents: parsed.priceCents,
      currency: parsed.currency,
      shipsTo: parsed.shipsTo,
      specs: parsed.specs as Record<string, unknown>,
      status: d.inReview ? 'in-review' : 'live',
      submittedAt: new Date(approvedAt - 3600_000),
      published,
      hazards: d.hazards ?? [],
      exportControlled: d.exportControlled ?? false,
      exportNote: d.exportNote ?? null,
    });
    created.push({ id, demo: d });
  }
  return created;
}
