// Laser specs: the fit engine's LaserSpec (wavelength coverage, linewidth, power; physics.md A8)
// plus the hazard class the seller confirms. The fit engine's laserHazardClass only suggests a
// class from power and wavelength; the listing stores what the seller confirms (an enclosed
// product can carry a lower class than its beam), so no class is refused here.

import { z } from 'zod';
import { laserHazardClass, type HazardSuggestion } from '../fit';
import { booleanSchema, checkRange, enumSchema, issue, numberSchema, positiveSchema, tolerancedSchema } from './common';
import type { FieldDef, SelectOption } from './field-def';
import { U } from './form-units';

export const LASER_TYPES = ['ecdl', 'dfb', 'dbr', 'fibre', 'solid-state', 'ti-sapphire', 'vecsel', 'gas', 'dye', 'other'] as const;
export const LASER_TYPE_OPTIONS: SelectOption[] = [
  { value: 'ecdl', label: 'External-cavity diode laser' },
  { value: 'dfb', label: 'DFB diode laser' },
  { value: 'dbr', label: 'DBR diode laser' },
  { value: 'fibre', label: 'Fibre laser' },
  { value: 'solid-state', label: 'Solid-state (e.g. NPRO)' },
  { value: 'ti-sapphire', label: 'Ti:sapphire' },
  { value: 'vecsel', label: 'VECSEL' },
  { value: 'gas', label: 'Gas laser' },
  { value: 'dye', label: 'Dye laser' },
  { value: 'other', label: 'Other' },
];

export const HAZARD_CLASSES = ['1', '2', '3R', '3B', '4'] as const;
export type LaserHazardClass = (typeof HAZARD_CLASSES)[number];

export const LaserSpecsSchema = z
  .object({
    type: enumSchema(LASER_TYPES, 'a laser type'),
    centreWavelengthNm: positiveSchema(),
    tuningMinNm: positiveSchema().optional(),
    tuningMaxNm: positiveSchema().optional(),
    linewidthHz: tolerancedSchema(positiveSchema()),
    linewidthTimeS: positiveSchema().optional(),
    powerW: tolerancedSchema(positiveSchema()),
    singleFrequency: booleanSchema(),
    fibreOutput: booleanSchema(),
    m2: numberSchema().min(1, 'M² is at least 1 (a perfect Gaussian beam).').optional(),
    hazardClass: enumSchema(HAZARD_CLASSES, 'the hazard class (IEC 60825-1)'),
  })
  .superRefine((s, ctx) => {
    const { tuningMinNm: min, tuningMaxNm: max } = s;
    if ((min === undefined) !== (max === undefined)) {
      issue(ctx, [min === undefined ? 'tuningMinNm' : 'tuningMaxNm'], 'Give both ends of the tuning range, or neither.');
      return;
    }
    if (min === undefined || max === undefined) return;
    if (checkRange(ctx, min, max, 'tuningMaxNm', 'tuning range') && (s.centreWavelengthNm < min || s.centreWavelengthNm > max)) {
      issue(
        ctx,
        ['centreWavelengthNm'],
        `The centre wavelength ${s.centreWavelengthNm} nm lies outside the tuning range ${min}–${max} nm.`,
      );
    }
  });

export type LaserSpecs = z.infer<typeof LaserSpecsSchema>;

/** The class the fit engine suggests from the upper end of the power (the seller confirms or changes it). */
export function suggestedHazardClass(specs: Pick<LaserSpecs, 'centreWavelengthNm' | 'powerW'>): HazardSuggestion {
  return laserHazardClass({ wavelengthM: specs.centreWavelengthNm * 1e-9, powerW: specs.powerW.value + (specs.powerW.tol ?? 0) });
}

const nmDisplay = { unit: 'nm', sig: 6 };

export const LASER_FIELDS: FieldDef[] = [
  { path: 'type', label: 'Type', kind: 'select', required: true, options: LASER_TYPE_OPTIONS, textLabel: '' },
  {
    path: 'centreWavelengthNm',
    label: 'Centre wavelength',
    kind: 'number',
    required: true,
    units: U.wavelengthNm,
    display: nmDisplay,
    textLabel: '',
  },
  {
    path: 'tuningMinNm',
    label: 'Tuning range from',
    kind: 'number',
    required: false,
    units: U.wavelengthNm,
    display: nmDisplay,
    rangeTo: 'tuningMaxNm',
    rangeLabel: 'Tuning range',
    textLabel: 'tuning',
  },
  { path: 'tuningMaxNm', label: 'Tuning range to', kind: 'number', required: false, units: U.wavelengthNm, display: nmDisplay },
  {
    path: 'linewidthHz',
    label: 'Linewidth (FWHM)',
    kind: 'toleranced',
    required: true,
    units: U.linewidthHz,
    hint: 'As a frequency, or in pm (converted at the centre wavelength).',
    display: { unit: 'Hz', si: true },
    textLabel: 'linewidth',
  },
  {
    path: 'linewidthTimeS',
    label: 'Linewidth measured over',
    kind: 'number',
    required: false,
    units: U.timeS,
    display: { unit: 's', si: true },
    textLabel: 'over',
  },
  {
    path: 'powerW',
    label: 'Output power',
    kind: 'toleranced',
    required: true,
    units: U.powerW,
    display: { unit: 'W', si: true },
    textLabel: '',
  },
  { path: 'singleFrequency', label: 'Single-frequency', kind: 'boolean', required: true, textLabel: 'single-frequency' },
  { path: 'fibreOutput', label: 'Fibre output', kind: 'boolean', required: true, textLabel: 'fibre output' },
  { path: 'm2', label: 'Beam quality M²', kind: 'number', required: false, display: { unit: '', sig: 3 }, textLabel: 'M²' },
  {
    path: 'hazardClass',
    label: 'Laser hazard class',
    kind: 'select',
    required: true,
    options: HAZARD_CLASSES.map((c) => ({ value: c, label: `Class ${c}` })),
    hint: 'The class under IEC 60825-1 as labelled on the product; the form suggests one from power and wavelength, you confirm it.',
    textLabel: '',
  },
];
