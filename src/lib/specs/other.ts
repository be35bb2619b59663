// Other components (modulators, isolators, wave plates, polarising optics): the wavelength range and
// aperture every one has, and the few numbers that matter per kind, all optional.

import { z } from 'zod';
import { checkRange, enumSchema, nonNegativeSchema, positiveSchema } from './common';
import type { FieldDef, SelectOption } from './field-def';
import { U } from './form-units';

export const COMPONENT_KINDS = [
  'electro-optic-modulator',
  'acousto-optic-modulator',
  'isolator',
  'faraday-rotator',
  'wave-plate',
  'polariser',
  'beam-splitter',
  'fibre-component',
  'other',
] as const;

const COMPONENT_OPTIONS: SelectOption[] = [
  { value: 'electro-optic-modulator', label: 'Electro-optic modulator' },
  { value: 'acousto-optic-modulator', label: 'Acousto-optic modulator' },
  { value: 'isolator', label: 'Optical isolator' },
  { value: 'faraday-rotator', label: 'Faraday rotator' },
  { value: 'wave-plate', label: 'Wave plate' },
  { value: 'polariser', label: 'Polariser' },
  { value: 'beam-splitter', label: 'Beam splitter' },
  { value: 'fibre-component', label: 'Fibre component' },
  { value: 'other', label: 'Other' },
];

export const OtherSpecsSchema = z
  .object({
    componentType: enumSchema(COMPONENT_KINDS, 'the kind of component'),
    wavelengthMinNm: positiveSchema(),
    wavelengthMaxNm: positiveSchema(),
    apertureMm: positiveSchema().optional(),
    insertionLossDb: nonNegativeSchema().optional(),
    isolationDb: nonNegativeSchema().optional(),
    extinctionRatioDb: nonNegativeSchema().optional(),
    halfWaveVoltageV: positiveSchema().optional(),
    bandwidthHz: positiveSchema().optional(),
    retardanceWaves: positiveSchema().optional(),
  })
  .superRefine((s, ctx) => {
    checkRange(ctx, s.wavelengthMinNm, s.wavelengthMaxNm, 'wavelengthMaxNm', 'wavelength range');
  });

export type OtherSpecs = z.infer<typeof OtherSpecsSchema>;

const nmDisplay = { unit: 'nm', sig: 6 };
const dbDisplay = { unit: 'dB', sig: 3 };

export const OTHER_FIELDS: FieldDef[] = [
  { path: 'componentType', label: 'Kind', kind: 'select', required: true, options: COMPONENT_OPTIONS, textLabel: '' },
  {
    path: 'wavelengthMinNm',
    label: 'Wavelength range from',
    kind: 'number',
    required: true,
    units: U.wavelengthNm,
    display: nmDisplay,
    rangeTo: 'wavelengthMaxNm',
    rangeLabel: 'Wavelength range',
    textLabel: '',
  },
  { path: 'wavelengthMaxNm', label: 'Wavelength range to', kind: 'number', required: true, units: U.wavelengthNm, display: nmDisplay },
  {
    path: 'apertureMm',
    label: 'Clear aperture',
    kind: 'number',
    required: false,
    units: U.lengthMm,
    display: { unit: 'mm' },
    textLabel: 'aperture',
  },
  {
    path: 'insertionLossDb',
    label: 'Insertion loss',
    kind: 'number',
    required: false,
    units: U.db,
    display: dbDisplay,
    textLabel: 'insertion loss',
  },
  { path: 'isolationDb', label: 'Isolation', kind: 'number', required: false, units: U.db, display: dbDisplay, textLabel: 'isolation' },
  {
    path: 'extinctionRatioDb',
    label: 'Extinction ratio',
    kind: 'number',
    required: false,
    units: U.db,
    display: dbDisplay,
    textLabel: 'extinction',
  },
  {
    path: 'halfWaveVoltageV',
    label: 'Half-wave voltage',
    kind: 'number',
    required: false,
    units: U.voltageV,
    display: { unit: 'V', sig: 3 },
    textLabel: 'Vπ',
  },
  {
    path: 'bandwidthHz',
    label: 'Modulation bandwidth',
    kind: 'number',
    required: false,
    units: U.frequencyHz,
    display: { unit: 'Hz', si: true },
    textLabel: 'bandwidth',
  },
  {
    path: 'retardanceWaves',
    label: 'Retardance',
    kind: 'number',
    required: false,
    display: { unit: 'waves', sig: 4 },
    hint: '0.5 for a half-wave plate, 0.25 for a quarter-wave plate.',
    textLabel: 'retardance',
  },
];
