// Cavity mirror specs: the stored form is the fit engine's MirrorSpec (without the measured spectrum
// and ring-down, which come from measurement files). R = 1 − T − loss (physics.md A1), so T + loss
// must stay below 1 (10⁶ ppm).

import { z } from 'zod';
import { checkRange, issue, nonNegativeSchema, numberSchema, positiveSchema, textSchema, tolerancedSchema } from './common';
import type { FieldDef } from './field-def';
import { roundStored, U } from './form-units';

const PPM_TOTAL = 1e6;

export const CavityMirrorSpecsSchema = z
  .object({
    diameterMm: positiveSchema(),
    thicknessMm: positiveSchema().optional(),
    substrate: textSchema(80),
    rocMm: positiveSchema().nullable(),
    designWavelengthNm: positiveSchema(),
    bandMinNm: positiveSchema(),
    bandMaxNm: positiveSchema(),
    transmissionPpm: tolerancedSchema(nonNegativeSchema()),
    lossPpm: tolerancedSchema(nonNegativeSchema()),
    aoiDeg: numberSchema().min(0, 'Use 0° to below 90°.').lt(90, 'Use 0° to below 90°.'),
    roughnessNm: positiveSchema().optional(),
  })
  .superRefine((s, ctx) => {
    const total = s.transmissionPpm.value + s.lossPpm.value;
    if (!(total < PPM_TOTAL)) {
      const msg = `Transmission + loss is ${roundStored(total)} ppm: it must stay below 1 000 000 ppm (100 %), since R = 1 − T − loss.`;
      issue(ctx, ['transmissionPpm', 'value'], msg);
      issue(ctx, ['lossPpm', 'value'], msg);
    }
    if (checkRange(ctx, s.bandMinNm, s.bandMaxNm, 'bandMaxNm', 'coating band')) {
      if (s.designWavelengthNm < s.bandMinNm || s.designWavelengthNm > s.bandMaxNm) {
        issue(
          ctx,
          ['designWavelengthNm'],
          `The design wavelength ${s.designWavelengthNm} nm lies outside the coating band ${s.bandMinNm}–${s.bandMaxNm} nm.`,
        );
      }
    }
  });

export type CavityMirrorSpecs = z.infer<typeof CavityMirrorSpecsSchema>;

const ppmDisplay = { unit: 'ppm' };
const nmDisplay = { unit: 'nm', sig: 6 };

export const CAVITY_MIRROR_FIELDS: FieldDef[] = [
  { path: 'diameterMm', label: 'Diameter', kind: 'number', required: true, units: U.lengthMm, display: { unit: 'mm' } },
  { path: 'thicknessMm', label: 'Thickness', kind: 'number', required: false, units: U.lengthMm, display: { unit: 'mm' } },
  {
    path: 'substrate',
    label: 'Substrate',
    kind: 'text',
    required: true,
    suggestions: ['fused silica', 'ULE', 'BK7', 'sapphire', 'silicon', 'CaF₂', 'crystalline GaAs/AlGaAs'],
    textLabel: '',
  },
  {
    path: 'rocMm',
    label: 'Radius of curvature',
    kind: 'nullable-number',
    required: true,
    units: U.radiusMm,
    nullLabel: 'flat',
    hint: 'Concave toward the cavity; tick "flat" for a planar mirror.',
    display: { unit: 'm', scale: 1e-3, si: true },
    textLabel: 'ROC',
  },
  {
    path: 'designWavelengthNm',
    label: 'Design wavelength',
    kind: 'number',
    required: true,
    units: U.wavelengthNm,
    display: nmDisplay,
    textLabel: '',
  },
  {
    path: 'bandMinNm',
    label: 'Coating band from',
    kind: 'number',
    required: true,
    units: U.wavelengthNm,
    hint: 'The band over which the transmission and loss below hold.',
    display: nmDisplay,
    rangeTo: 'bandMaxNm',
    rangeLabel: 'Coating band',
    textLabel: 'band',
  },
  { path: 'bandMaxNm', label: 'Coating band to', kind: 'number', required: true, units: U.wavelengthNm, display: nmDisplay },
  {
    path: 'transmissionPpm',
    label: 'Transmission',
    kind: 'toleranced',
    required: true,
    units: U.ppm,
    hint: 'Power transmission at the design wavelength, ± its tolerance.',
    display: ppmDisplay,
  },
  {
    path: 'lossPpm',
    label: 'Loss (absorption + scatter)',
    kind: 'toleranced',
    required: true,
    units: U.ppm,
    hint: 'Or give the reflectivity below instead: the loss is then 1 − R − T.',
    display: ppmDisplay,
    textLabel: 'loss',
  },
  {
    path: 'reflectivity',
    label: 'Reflectivity (instead of the loss)',
    kind: 'toleranced',
    required: false,
    units: U.reflectivityPpm,
    hint: 'Only when the loss is not known: loss = 1 − R − T, with the tolerance of R.',
    alternative: {
      replaces: 'lossPpm',
      derive: (r, draft) => {
        const t = draft['transmissionPpm'] as { value: number } | undefined;
        if (t === undefined) return 'Give the transmission too: the loss is 1 − R − T.';
        // Rounded to 1e-6 ppm: R near 100 % leaves float noise far below any quoted digit.
        const loss = Math.round((PPM_TOTAL - r.value - t.value) * 1e6) / 1e6;
        if (loss < 0) return 'R + T exceed 100 %: the loss 1 − R − T would be negative.';
        return r.tol === undefined ? { value: loss } : { value: loss, tol: r.tol };
      },
    },
  },
  {
    path: 'aoiDeg',
    label: 'Angle of incidence',
    kind: 'number',
    required: true,
    units: U.angleDeg,
    hint: '0° for a linear cavity.',
    display: { unit: '°', tight: true },
    textLabel: 'AOI',
  },
  {
    path: 'roughnessNm',
    label: 'Surface roughness (rms)',
    kind: 'number',
    required: false,
    units: U.roughnessNm,
    display: { unit: 'nm rms', sig: 3 },
    textLabel: 'roughness',
  },
];
