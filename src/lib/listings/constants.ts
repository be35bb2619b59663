/** Names shared by the listing schemas, the API, the pages and the database. */
export const CATEGORIES = [
  'cavity-mirror',
  'photodiode',
  'balanced-detector',
  'single-photon-detector',
  'laser',
  'nonlinear-crystal',
  'other',
] as const;
export type Category = (typeof CATEGORIES)[number];

export const CATEGORY_LABELS: Record<Category, string> = {
  'cavity-mirror': 'Cavity mirror',
  photodiode: 'Photodiode',
  'balanced-detector': 'Balanced detector',
  'single-photon-detector': 'Single-photon detector',
  laser: 'Laser',
  'nonlinear-crystal': 'Nonlinear crystal',
  other: 'Other component',
};

export const CONDITIONS = ['new', 'like-new', 'used-tested', 'used-untested', 'for-parts'] as const;
export type Condition = (typeof CONDITIONS)[number];
export const CONDITION_LABELS: Record<Condition, string> = {
  new: 'New in package',
  'like-new': 'Like new',
  'used-tested': 'Used and tested (with data)',
  'used-untested': 'Used, untested',
  'for-parts': 'For parts',
};

export const REGIONS = ['EU', 'UK', 'US', 'CA', 'APAC', 'WORLD'] as const;
export type Region = (typeof REGIONS)[number];
export const REGION_LABELS: Record<Region, string> = {
  EU: 'European Union',
  UK: 'United Kingdom',
  US: 'United States',
  CA: 'Canada',
  APAC: 'Asia–Pacific',
  WORLD: 'Worldwide',
};

export const LISTING_STATUSES = ['draft', 'in-review', 'live', 'changes-requested', 'rejected', 'sold-out', 'archived'] as const;
export type ListingStatus = (typeof LISTING_STATUSES)[number];
export const STATUS_LABELS: Record<ListingStatus, string> = {
  draft: 'Draft',
  'in-review': 'In review',
  live: 'Live',
  'changes-requested': 'Changes requested',
  rejected: 'Rejected',
  'sold-out': 'Sold out',
  archived: 'Archived',
};

export const HAZARDS = ['laser', 'high-voltage', 'cryogenic', 'pressurised-gas', 'fragile'] as const;
export type Hazard = (typeof HAZARDS)[number];

export const FILE_KINDS = ['photo', 'datasheet', 'measurement'] as const;
export type FileKind = (typeof FILE_KINDS)[number];
export const MEASUREMENT_KINDS = ['spectrum', 'ringdown', 'efficiency-curve'] as const;
export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number];
