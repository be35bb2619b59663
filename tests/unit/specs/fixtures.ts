// Valid listing bodies and specs per category, the starting points the tests break one field of.

import type { SpecsByCategory } from '../../../src/lib/specs';

export const MIRROR_SPECS: SpecsByCategory['cavity-mirror'] = {
  diameterMm: 7.75,
  substrate: 'fused silica',
  rocMm: 1000,
  designWavelengthNm: 780,
  bandMinNm: 760,
  bandMaxNm: 800,
  transmissionPpm: { value: 2, tol: 0.5 },
  lossPpm: { value: 8 },
  aoiDeg: 0,
  roughnessNm: 0.1,
};

export const MIRROR_LISTING = {
  category: 'cavity-mirror',
  title: 'Matched pair of 780 nm supermirrors',
  description: 'Used in a **cavity-QED** experiment; ring-down attached.',
  condition: 'used-tested',
  quantity: 2,
  priceCents: 240_000,
  currency: 'EUR',
  shipsTo: ['EU', 'UK'],
  specs: MIRROR_SPECS,
} as const;

export const PHOTODIODE_SPECS: SpecsByCategory['photodiode'] = {
  material: 'InGaAs',
  activeDiameterMm: 0.5,
  wavelengthNm: 1550,
  quantumEfficiency: { value: 0.99, tol: 0.005 },
  bandwidthHz: 100e6,
  darkCurrentA: 1e-9,
  capacitanceF: 5e-12,
  saturationPowerW: 10e-3,
  noiseCurrentAPerRtHz: { value: 5e-12, tol: 1e-12 },
};

export const BALANCED_SPECS: SpecsByCategory['balanced-detector'] = {
  ...PHOTODIODE_SPECS,
  cmrrDb: 40,
};

export const SPD_SPECS: SpecsByCategory['single-photon-detector'] = {
  technology: 'snspd',
  wavelengthNm: 1550,
  efficiency: { value: 0.9, tol: 0.02 },
  darkCountRateHz: { value: 100, tol: 20 },
  jitterFwhmS: 50e-12,
  deadTimeS: 50e-9,
  afterpulsing: 0,
  cooling: 'cryocooler',
};

export const LASER_SPECS: SpecsByCategory['laser'] = {
  type: 'solid-state',
  centreWavelengthNm: 1064,
  tuningMinNm: 1063.9,
  tuningMaxNm: 1064.1,
  linewidthHz: { value: 1e3, tol: 200 },
  linewidthTimeS: 0.1,
  powerW: { value: 2, tol: 0.1 },
  singleFrequency: true,
  fibreOutput: false,
  m2: 1.05,
  hazardClass: '4',
};

export const CRYSTAL_SPECS: SpecsByCategory['nonlinear-crystal'] = {
  material: 'PPKTP',
  polingPeriodsUm: [9.0, 9.1],
  phaseMatching: 'type-0',
  pumpWavelengthNm: 532,
  signalWavelengthNm: 1064,
  idlerWavelengthNm: 1064,
  lengthMm: 10,
  widthMm: 2,
  heightMm: 1,
  coatings: 'AR 1064/532 nm both faces',
  ovenIncluded: true,
};

export const OTHER_SPECS: SpecsByCategory['other'] = {
  componentType: 'isolator',
  wavelengthMinNm: 1030,
  wavelengthMaxNm: 1080,
  apertureMm: 5,
  insertionLossDb: 0.3,
  isolationDb: 38,
};

export const SPECS_BY_CATEGORY: SpecsByCategory = {
  'cavity-mirror': MIRROR_SPECS,
  photodiode: PHOTODIODE_SPECS,
  'balanced-detector': BALANCED_SPECS,
  'single-photon-detector': SPD_SPECS,
  laser: LASER_SPECS,
  'nonlinear-crystal': CRYSTAL_SPECS,
  other: OTHER_SPECS,
};
