// Photodiode specs: the stored form is the fit engine's PhotodiodeSpec (without the measured QE
// curve, which comes from a measurement file). The squeezing evaluator reads the quantum efficiency
// (or responsivity) at its stated wavelength, the bandwidth, the saturation power and the
// input-referred noise (or NEP); physics.md A12 forms 12.1–12.3.

import { z } from 'zod';
import { quantumEfficiencyFromResponsivity } from '../fit';
import { efficiencySchema, issue, positiveSchema, requireWavelengthFor, textSchema, tolerancedSchema } from './common';
import type { FieldDef } from './field-def';
import { U } from './form-units';

export const photodiodeShape = {
  material: textSchema(60),
  activeDiameterMm: positiveSchema().optional(),
  wavelengthNm: positiveSchema().optional(),
  quantumEfficiency: tolerancedSchema(efficiencySchema()).optional(),
  responsivityAW: tolerancedSchema(positiveSchema()).optional(),
  bandwidthHz: positiveSchema(),
  darkCurrentA: positiveSchema().optional(),
  capacitanceF: positiveSchema().optional(),
  saturationPowerW: positiveSchema().optional(),
  noiseCurrentAPerRtHz: tolerancedSchema(positiveSchema()).optional(),
  nepWPerRtHz: positiveSchema().optional(),
};

type PhotodiodeShape = z.infer<z.ZodObject<typeof photodiodeShape>>;

/** QE or responsivity need their wavelength; a responsivity must imply a QE in (0, 1] there (form 12.1). */
export function checkPhotodiode(s: PhotodiodeShape, ctx: z.RefinementCtx): void {
  requireWavelengthFor(ctx, s, s.quantumEfficiency !== undefined || s.responsivityAW !== undefined, 'quantum efficiency or responsivity');
  if (s.responsivityAW !== undefined && s.wavelengthNm !== undefined) {
    const qe = quantumEfficiencyFromResponsivity({ responsivityAW: s.responsivityAW.value, wavelengthM: s.wavelengthNm * 1e-9 });
    if (qe > 1) {
      issue(
        ctx,
        ['responsivityAW', 'value'],
        `${s.responsivityAW.value} A/W at ${s.wavelengthNm} nm means a quantum efficiency of ${qe.toPrecision(3)}, above 1 (η = ℜ·hc/(eλ)).`,
      );
    }
  }
}

export const PhotodiodeSpecsSchema = z.object(photodiodeShape).superRefine(checkPhotodiode);

export type PhotodiodeSpecs = z.infer<typeof PhotodiodeSpecsSchema>;

const qeDisplay = { unit: '%', scale: 100, sig: 3 };

export const PHOTODIODE_FIELDS: FieldDef[] = [
  {
    path: 'material',
    label: 'Material',
    kind: 'text',
    required: true,
    suggestions: ['Si', 'InGaAs', 'extended InGaAs', 'Ge', 'GaAs', 'InAs', 'HgCdTe'],
    textLabel: '',
  },
  {
    path: 'activeDiameterMm',
    label: 'Active diameter',
    kind: 'number',
    required: false,
    units: U.lengthMm,
    display: { unit: 'mm' },
    textLabel: 'active diameter',
  },
  {
    path: 'wavelengthNm',
    label: 'Wavelength of the QE',
    kind: 'number',
    required: false,
    units: U.wavelengthNm,
    hint: 'The wavelength the quantum efficiency or responsivity below refers to.',
    display: { unit: 'nm', sig: 6 },
    textLabel: 'at',
  },
  {
    path: 'quantumEfficiency',
    label: 'Quantum efficiency',
    kind: 'toleranced',
    required: false,
    units: U.quantumEfficiency,
    hint: 'As % or a fraction, or as a responsivity in A/W (converted at the wavelength above).',
    display: qeDisplay,
    textLabel: 'QE',
  },
  {
    path: 'responsivityAW',
    label: 'Responsivity',
    kind: 'toleranced',
    required: false,
    units: U.responsivityAW,
    display: { unit: 'A/W', sig: 3 },
    formHidden: true,
  },
  {
    path: 'bandwidthHz',
    label: 'Bandwidth (−3 dB)',
    kind: 'number',
    required: true,
    units: U.frequencyHz,
    display: { unit: 'Hz', si: true },
    textLabel: 'bandwidth',
  },
  {
    path: 'darkCurrentA',
    label: 'Dark current',
    kind: 'number',
    required: false,
    units: U.currentA,
    display: { unit: 'A', si: true },
    textLabel: 'dark current',
  },
  { path: 'capacitanceF', label: 'Capacitance', kind: 'number', required: false, units: U.capacitanceF, display: { unit: 'F', si: true } },
  {
    path: 'saturationPowerW',
    label: 'Saturation power',
    kind: 'number',
    required: false,
    units: U.powerW,
    display: { unit: 'W', si: true },
    textLabel: 'saturation',
  },
  {
    path: 'noiseCurrentAPerRtHz',
    label: 'Input-referred electronic noise',
    kind: 'toleranced',
    required: false,
    units: U.noiseCurrentAPerRtHz,
    hint: 'As a noise current, or as an NEP (converted with the responsivity at the QE wavelength: i_n = NEP·ℜ).',
    display: { unit: 'A/√Hz', si: true },
    textLabel: 'noise',
  },
  {
    path: 'nepWPerRtHz',
    label: 'Noise-equivalent power',
    kind: 'number',
    required: false,
    units: U.nepWPerRtHz,
    display: { unit: 'W/√Hz', si: true },
    formHidden: true,
    textLabel: 'NEP',
  },
];
