// Single-photon detector specs: the stored form is the fit engine's SinglePhotonDetectorSpec
// (without the measured efficiency curve, which comes from a measurement file). The counting
// evaluator reads the efficiency at its stated wavelength, dark counts, jitter (FWHM), dead time
// and afterpulsing; physics.md A6.

import { z } from 'zod';
import {
  efficiencySchema,
  enumSchema,
  nonNegativeSchema,
  positiveSchema,
  probabilitySchema,
  requireWavelengthFor,
  tolerancedSchema,
} from './common';
import type { FieldDef, SelectOption } from './field-def';
import { U } from './form-units';

export const DETECTOR_TECHNOLOGIES = ['si-spad', 'ingaas-spad', 'snspd', 'pmt', 'tes', 'other'] as const;
export const TECHNOLOGY_OPTIONS: SelectOption[] = [
  { value: 'si-spad', label: 'Si avalanche diode (SPAD)' },
  { value: 'ingaas-spad', label: 'InGaAs/InP avalanche diode' },
  { value: 'snspd', label: 'Superconducting nanowire (SNSPD)' },
  { value: 'pmt', label: 'Photomultiplier' },
  { value: 'tes', label: 'Transition-edge sensor' },
  { value: 'other', label: 'Other' },
];

export const COOLING_KINDS = ['none', 'peltier', 'cryocooler', 'liquid-nitrogen', 'liquid-helium'] as const;
export type Cooling = (typeof COOLING_KINDS)[number];
export const COOLING_OPTIONS: SelectOption[] = [
  { value: 'none', label: 'none (room temperature)' },
  { value: 'peltier', label: 'Peltier (thermoelectric)' },
  { value: 'cryocooler', label: 'closed-cycle cryocooler' },
  { value: 'liquid-nitrogen', label: 'liquid nitrogen' },
  { value: 'liquid-helium', label: 'liquid helium' },
];

/** Coolings that bring cryogenic and pressurised-gas cautions (product.md, Cautions). */
export const CRYOGENIC_COOLING: readonly Cooling[] = ['cryocooler', 'liquid-nitrogen', 'liquid-helium'];

export const SinglePhotonDetectorSpecsSchema = z
  .object({
    technology: enumSchema(DETECTOR_TECHNOLOGIES, 'a technology'),
    wavelengthNm: positiveSchema().optional(),
    efficiency: tolerancedSchema(efficiencySchema()).optional(),
    darkCountRateHz: tolerancedSchema(nonNegativeSchema()),
    jitterFwhmS: positiveSchema(),
    deadTimeS: positiveSchema(),
    afterpulsing: probabilitySchema().optional(),
    cooling: enumSchema(COOLING_KINDS, 'the cooling'),
  })
  .superRefine((s, ctx) => requireWavelengthFor(ctx, s, s.efficiency !== undefined, 'detection efficiency'));

export type SinglePhotonDetectorSpecs = z.infer<typeof SinglePhotonDetectorSpecsSchema>;

export const SINGLE_PHOTON_DETECTOR_FIELDS: FieldDef[] = [
  { path: 'technology', label: 'Technology', kind: 'select', required: true, options: TECHNOLOGY_OPTIONS, textLabel: '' },
  {
    path: 'wavelengthNm',
    label: 'Wavelength of the efficiency',
    kind: 'number',
    required: false,
    units: U.wavelengthNm,
    display: { unit: 'nm', sig: 6 },
    textLabel: 'at',
  },
  {
    path: 'efficiency',
    label: 'System detection efficiency',
    kind: 'toleranced',
    required: false,
    units: U.fraction,
    hint: 'At the wavelength above, including fibre coupling when fibre-coupled.',
    display: { unit: '%', scale: 100, sig: 3 },
    textLabel: 'efficiency',
  },
  {
    path: 'darkCountRateHz',
    label: 'Dark count rate',
    kind: 'toleranced',
    required: true,
    units: U.rateHz,
    display: { unit: 'counts/s', sig: 3 },
    textLabel: 'dark counts',
  },
  {
    path: 'jitterFwhmS',
    label: 'Timing jitter (FWHM)',
    kind: 'number',
    required: true,
    units: U.timeS,
    display: { unit: 's', si: true },
    textLabel: 'jitter',
  },
  {
    path: 'deadTimeS',
    label: 'Dead time',
    kind: 'number',
    required: true,
    units: U.timeS,
    display: { unit: 's', si: true },
    textLabel: 'dead time',
  },
  {
    path: 'afterpulsing',
    label: 'Afterpulsing probability',
    kind: 'number',
    required: false,
    units: U.fraction,
    display: { unit: '%', scale: 100, sig: 3 },
    textLabel: 'afterpulsing',
  },
  { path: 'cooling', label: 'Cooling', kind: 'select', required: true, options: COOLING_OPTIONS, textLabel: 'cooling' },
];
