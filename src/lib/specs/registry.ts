// One schema and one field list per category.

import type { z } from 'zod';
import type { Category } from '../listings/constants';
import { BALANCED_DETECTOR_FIELDS, BalancedDetectorSpecsSchema } from './balanced-detector';
import { CAVITY_MIRROR_FIELDS, CavityMirrorSpecsSchema } from './cavity-mirror';
import type { FieldDef } from './field-def';
import { LASER_FIELDS, LaserSpecsSchema } from './laser';
import { NONLINEAR_CRYSTAL_FIELDS, NonlinearCrystalSpecsSchema } from './nonlinear-crystal';
import { OTHER_FIELDS, OtherSpecsSchema } from './other';
import { PHOTODIODE_FIELDS, PhotodiodeSpecsSchema } from './photodiode';
import { SINGLE_PHOTON_DETECTOR_FIELDS, SinglePhotonDetectorSpecsSchema } from './single-photon-detector';

export const SPEC_SCHEMAS = {
  'cavity-mirror': CavityMirrorSpecsSchema,
  photodiode: PhotodiodeSpecsSchema,
  'balanced-detector': BalancedDetectorSpecsSchema,
  'single-photon-detector': SinglePhotonDetectorSpecsSchema,
  laser: LaserSpecsSchema,
  'nonlinear-crystal': NonlinearCrystalSpecsSchema,
  other: OtherSpecsSchema,
} as const satisfies Record<Category, z.ZodTypeAny>;

/** The stored specs of each category. */
export type SpecsByCategory = { [C in Category]: z.infer<(typeof SPEC_SCHEMAS)[C]> };
export type Specs = SpecsByCategory[Category];

export const CATEGORY_FIELDS: Record<Category, readonly FieldDef[]> = {
  'cavity-mirror': CAVITY_MIRROR_FIELDS,
  photodiode: PHOTODIODE_FIELDS,
  'balanced-detector': BALANCED_DETECTOR_FIELDS,
  'single-photon-detector': SINGLE_PHOTON_DETECTOR_FIELDS,
  laser: LASER_FIELDS,
  'nonlinear-crystal': NONLINEAR_CRYSTAL_FIELDS,
  other: OTHER_FIELDS,
};
