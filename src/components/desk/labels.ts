import type { ListingStatus, MeasurementKind } from '../../lib/listings/constants';

export const MEASUREMENT_KIND_LABELS: Record<MeasurementKind, string> = {
  spectrum: 'Transmission or reflectance spectrum',
  ringdown: 'Cavity ring-down trace',
  'efficiency-curve': 'Quantum- or detection-efficiency curve',
};

/** The header each parser reads, so a seller can fix a file before uploading it. */
export const MEASUREMENT_FORMAT_HINTS: Record<MeasurementKind, string> = {
  spectrum: 'Header like wavelength_nm,transmission_ppm,loss_ppm (or "R (%)"); one row per wavelength.',
  ringdown: 'Header like time_us,intensity; add a line "# length_m=0.05" for loss and finesse.',
  'efficiency-curve': 'Header like wavelength_nm,qe_pct; one row per wavelength.',
};

/** Lifecycle order, for sorting the desk by status. */
export const STATUS_ORDER: Record<ListingStatus, number> = {
  draft: 0,
  'changes-requested': 1,
  'in-review': 2,
  live: 3,
  'sold-out': 4,
  rejected: 5,
  archived: 6,
};

/** Statuses the server refuses to edit (a rejected or archived listing is duplicated instead). */
export const LOCKED_STATUSES: readonly ListingStatus[] = ['archived', 'rejected'];
