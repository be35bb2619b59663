// Balanced detector specs: a photodiode pair read as one PhotodiodeSpec by the squeezing evaluator,
// plus its common-mode rejection. The saturation power and noise refer to the pair (the local
// oscillator on both diodes together, as the evaluator's loPowerW does).

import { z } from 'zod';
import { nonNegativeSchema } from './common';
import type { FieldDef } from './field-def';
import { U } from './form-units';
import { checkPhotodiode, PHOTODIODE_FIELDS, photodiodeShape } from './photodiode';

export const BalancedDetectorSpecsSchema = z
  .object({ ...photodiodeShape, cmrrDb: nonNegativeSchema().optional() })
  .superRefine(checkPhotodiode);

export type BalancedDetectorSpecs = z.infer<typeof BalancedDetectorSpecsSchema>;

export const BALANCED_DETECTOR_FIELDS: FieldDef[] = [
  ...PHOTODIODE_FIELDS,
  {
    path: 'cmrrDb',
    label: 'Common-mode rejection',
    kind: 'number',
    required: false,
    units: U.db,
    display: { unit: 'dB', sig: 3 },
    textLabel: 'CMRR',
  },
];
