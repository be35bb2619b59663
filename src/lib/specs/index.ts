// Listing specs per category: zod schemas (shared by the form, the API, search and the fit
// evaluators: the stored specs of a category are the fit engine's input for it), form metadata,
// form ↔ stored conversion, and display.

export { SPEC_SCHEMAS, CATEGORY_FIELDS } from './registry';
export type { SpecsByCategory, Specs } from './registry';

export { CavityMirrorSpecsSchema } from './cavity-mirror';
export type { CavityMirrorSpecs } from './cavity-mirror';
export { PhotodiodeSpecsSchema } from './photodiode';
export type { PhotodiodeSpecs } from './photodiode';
export { BalancedDetectorSpecsSchema } from './balanced-detector';
export type { BalancedDetectorSpecs } from './balanced-detector';
export { SinglePhotonDetectorSpecsSchema, DETECTOR_TECHNOLOGIES, COOLING_KINDS, CRYOGENIC_COOLING } from './single-photon-detector';
export type { SinglePhotonDetectorSpecs, Cooling } from './single-photon-detector';
export { LaserSpecsSchema, LASER_TYPES, HAZARD_CLASSES, suggestedHazardClass } from './laser';
export type { LaserSpecs, LaserHazardClass } from './laser';
export { NonlinearCrystalSpecsSchema, PHASE_MATCHING_TYPES } from './nonlinear-crystal';
export type { NonlinearCrystalSpecs } from './nonlinear-crystal';
export { OtherSpecsSchema, COMPONENT_KINDS } from './other';
export type { OtherSpecs } from './other';

export type { Toleranced } from './common';
export type { FieldDef, FieldKind, DisplayDef, SelectOption, AlternativeDef } from './field-def';
export type { UnitChoice, SpecDraft } from './form-units';

export {
  CURRENCIES,
  CurrencySchema,
  ShipsToSchema,
  ListingInputSchema,
  ListingPatchSchema,
  listingPatchSchema,
  parseListingPatch,
} from './listing';
export type { Currency, ListingInput, ListingPatch } from './listing';

export { normaliseFormValue, toStoredSpecs, toFormValues, parseTypedNumber } from './form';
export type { QuantityInput, FormValue, FormValues, Normalised, StoredSpecsResult } from './form';

export { specRows, specsToText } from './display';
export type { SpecRow } from './display';
