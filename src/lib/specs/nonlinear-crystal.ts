// Nonlinear crystal specs. No goal evaluator takes a crystal yet; the fields are those the fit
// engine's qpmPeriod and idlerWavelength work with (physics.md A9): material, poling period(s),
// phase-matching type and the three wavelengths, which must conserve energy (form 9.1).

import { z } from 'zod';
import { booleanSchema, enumSchema, issue, numberSchema, positiveSchema, textSchema } from './common';
import type { FieldDef, SelectOption } from './field-def';
import { U } from './form-units';

export const PHASE_MATCHING_TYPES = ['type-0', 'type-I', 'type-II'] as const;
const PHASE_MATCHING_OPTIONS: SelectOption[] = PHASE_MATCHING_TYPES.map((t) => ({ value: t, label: t }));

/** 1/λp = 1/λs + 1/λi within this relative slack: quoted wavelengths are rounded to 0.1 nm or so. */
const ENERGY_SLACK = 1e-3;

export const NonlinearCrystalSpecsSchema = z
  .object({
    material: textSchema(60),
    polingPeriodsUm: z
      .array(positiveSchema(), { invalid_type_error: 'Give the poling periods as a list of numbers.' })
      .min(1, 'Give at least one poling period, or leave the field out.')
      .max(64, 'At most 64 gratings.')
      .optional(),
    phaseMatching: enumSchema(PHASE_MATCHING_TYPES, 'the phase-matching type'),
    pumpWavelengthNm: positiveSchema(),
    signalWavelengthNm: positiveSchema(),
    idlerWavelengthNm: positiveSchema().optional(),
    lengthMm: positiveSchema(),
    widthMm: positiveSchema().optional(),
    heightMm: positiveSchema().optional(),
    phaseMatchingTemperatureC: numberSchema().min(-273.15, 'Below absolute zero.').optional(),
    coatings: textSchema(200).optional(),
    ovenIncluded: booleanSchema(),
  })
  .superRefine((s, ctx) => {
    if (!(s.signalWavelengthNm > s.pumpWavelengthNm)) {
      issue(ctx, ['signalWavelengthNm'], 'The signal wavelength must be longer than the pump wavelength (1/λp = 1/λs + 1/λi).');
      return;
    }
    if (s.idlerWavelengthNm === undefined) return;
    const mismatch = Math.abs(1 / s.pumpWavelengthNm - 1 / s.signalWavelengthNm - 1 / s.idlerWavelengthNm) * s.pumpWavelengthNm;
    if (mismatch > ENERGY_SLACK) {
      const idler = 1 / (1 / s.pumpWavelengthNm - 1 / s.signalWavelengthNm);
      issue(
        ctx,
        ['idlerWavelengthNm'],
        `Energy conservation 1/λp = 1/λs + 1/λi gives an idler at ${idler.toFixed(1)} nm for this pump and signal.`,
      );
    }
  });

export type NonlinearCrystalSpecs = z.infer<typeof NonlinearCrystalSpecsSchema>;

const nmDisplay = { unit: 'nm', sig: 6 };
const mmDisplay = { unit: 'mm' };

export const NONLINEAR_CRYSTAL_FIELDS: FieldDef[] = [
  {
    path: 'material',
    label: 'Material',
    kind: 'text',
    required: true,
    suggestions: ['PPKTP', 'PPLN', 'MgO:PPLN', 'PPSLT', 'KTP', 'BBO', 'LBO', 'BiBO'],
    textLabel: '',
  },
  {
    path: 'polingPeriodsUm',
    label: 'Poling period(s)',
    kind: 'number-list',
    required: false,
    units: U.periodUm,
    hint: 'One value, or several separated by commas for a multi-grating crystal.',
    display: { unit: 'µm', sig: 5 },
    textLabel: 'period',
  },
  { path: 'phaseMatching', label: 'Phase matching', kind: 'select', required: true, options: PHASE_MATCHING_OPTIONS, textLabel: '' },
  {
    path: 'pumpWavelengthNm',
    label: 'Pump wavelength',
    kind: 'number',
    required: true,
    units: U.wavelengthNm,
    hint: 'The shortest wavelength of the process (the second harmonic for SHG).',
    display: nmDisplay,
    textLabel: 'pump',
  },
  {
    path: 'signalWavelengthNm',
    label: 'Signal wavelength',
    kind: 'number',
    required: true,
    units: U.wavelengthNm,
    display: nmDisplay,
    textLabel: 'signal',
  },
  {
    path: 'idlerWavelengthNm',
    label: 'Idler wavelength',
    kind: 'number',
    required: false,
    units: U.wavelengthNm,
    display: nmDisplay,
    textLabel: 'idler',
  },
  { path: 'lengthMm', label: 'Length', kind: 'number', required: true, units: U.lengthMm, display: mmDisplay, textLabel: 'length' },
  { path: 'widthMm', label: 'Width', kind: 'number', required: false, units: U.lengthMm, display: mmDisplay, textLabel: 'width' },
  { path: 'heightMm', label: 'Height', kind: 'number', required: false, units: U.lengthMm, display: mmDisplay, textLabel: 'height' },
  {
    path: 'phaseMatchingTemperatureC',
    label: 'Phase-matching temperature',
    kind: 'number',
    required: false,
    units: U.temperatureC,
    display: { unit: '°C', sig: 4 },
    textLabel: 'at',
  },
  { path: 'coatings', label: 'Coatings', kind: 'text', required: false, hint: 'e.g. AR 1064/532 nm both faces.', textLabel: 'coatings' },
  { path: 'ovenIncluded', label: 'Oven included', kind: 'boolean', required: true, textLabel: 'oven included' },
];
