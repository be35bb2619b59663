/**
 * What the search index keeps of one listing: only its approved (published) fields, the lab's name,
 * current stock, and the fit engine's input built from the published specs and the listing's parsed
 * measurement files.
 */
import type { Category, Condition, Hazard, Region } from '../../lib/listings/constants';
import { CATEGORY_LABELS } from '../../lib/listings/constants';
import { fitCandidate, type FitCandidate } from '../../lib/listings/fit-input';
import type { MeasurementData } from '../../lib/measurements/types';
import { roughEuroCents } from '../../lib/search/facets';
import type { ListingSummary } from '../../lib/search/results';
import { specsToText } from '../../lib/specs';
import type { PublishedListing } from '../db/schema';

export interface SearchDoc {
  id: string;
  category: Category;
  title: string;
  description: string;
  labName: string;
  condition: Condition;
  priceCents: number;
  currency: string;
  /** The price in euro cents through rough rates, for sorting and the price facet only. */
  euroCents: number;
  quantity: number;
  shipsTo: Region[];
  approvedAt: number;
  /** listings.version when this was read; a poll re-reads a listing only when it moved on. */
  version: number;
  hazards: Hazard[];
  exportControlled: boolean;
  hasMeasurements: boolean;
  photoId: string | null;
  /** The category label and the specs as words, for the full-text index. */
  categoryText: string;
  specsText: string;
  /** Wavelength spans the listing works over, nm (a point is a span of zero width). */
  wavelengths: [number, number][];
  candidate: FitCandidate;
}

export interface ListingRow {
  id: string;
  category: Category;
  quantity: number;
  published: PublishedListing;
  version: number;
  hazards: Hazard[];
  exportControlled: boolean;
  labName: string;
}

export interface FileRow {
  id: string;
  kind: 'photo' | 'datasheet' | 'measurement';
  data: unknown;
}

const num = (v: unknown): number | undefined => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);

function span(lo: unknown, hi: unknown): [number, number] | null {
  const a = num(lo);
  const b = num(hi);
  if (a === undefined) return null;
  return [a, b ?? a];
}

function curveSpan(points: readonly { wavelengthNm: number }[] | undefined): [number, number] | null {
  if (!points || points.length === 0) return null;
  let lo = Infinity;
  let hi = -Infinity;
  for (const p of points) {
    lo = Math.min(lo, p.wavelengthNm);
    hi = Math.max(hi, p.wavelengthNm);
  }
  return [lo, hi];
}

/** Where on the spectrum a listing works, for the wavelength facet: coating band, tuning range, quoted or measured wavelengths. */
export function wavelengthsOf(category: Category, specs: Record<string, unknown>, candidate: FitCandidate): [number, number][] {
  const spans: ([number, number] | null)[] = [];
  switch (category) {
    case 'cavity-mirror':
      spans.push(span(specs.bandMinNm, specs.bandMaxNm));
      if (candidate.kind === 'mirror') spans.push(curveSpan(candidate.spec.spectrum?.points));
      break;
    case 'photodiode':
    case 'balanced-detector':
      spans.push(span(specs.wavelengthNm, specs.wavelengthNm));
      if (candidate.kind === 'photodiode') spans.push(curveSpan(candidate.spec.qeCurve));
      break;
    case 'single-photon-detector':
      spans.push(span(specs.wavelengthNm, specs.wavelengthNm));
      if (candidate.kind === 'counter') spans.push(curveSpan(candidate.spec.efficiencyCurve));
      break;
    case 'laser':
      spans.push(span(specs.tuningMinNm, specs.tuningMaxNm) ?? span(specs.centreWavelengthNm, specs.centreWavelengthNm));
      break;
    case 'nonlinear-crystal':
      for (const k of ['pumpWavelengthNm', 'signalWavelengthNm', 'idlerWavelengthNm']) spans.push(span(specs[k], specs[k]));
      break;
    case 'other':
      spans.push(span(specs.wavelengthMinNm, specs.wavelengthMaxNm));
      break;
  }
  return spans.filter((s): s is [number, number] => s !== null);
}

export function toSearchDoc(row: ListingRow, files: readonly FileRow[]): SearchDoc {
  const p = row.published;
  const measurements = files.filter((f) => f.kind === 'measurement' && f.data).map((f) => f.data as MeasurementData);
  const candidate = fitCandidate(row.category, p.specs, measurements);
  return {
    id: row.id,
    category: row.category,
    title: p.title,
    description: p.description,
    labName: row.labName,
    condition: p.condition,
    priceCents: p.priceCents,
    currency: p.currency,
    euroCents: roughEuroCents(p.priceCents, p.currency),
    quantity: row.quantity,
    shipsTo: p.shipsTo,
    approvedAt: p.approvedAt,
    version: row.version,
    hazards: row.hazards,
    exportControlled: row.exportControlled,
    hasMeasurements: measurements.length > 0,
    photoId: files.find((f) => f.kind === 'photo')?.id ?? null,
    categoryText: CATEGORY_LABELS[row.category],
    specsText: specsToText(row.category, p.specs),
    wavelengths: wavelengthsOf(row.category, p.specs, candidate),
    candidate,
  };
}

/** The listing as search results show it. */
export function listingSummary(d: SearchDoc): ListingSummary {
  return {
    id: d.id,
    title: d.title,
    category: d.category,
    priceCents: d.priceCents,
    currency: d.currency,
    quantity: d.quantity,
    labName: d.labName,
    condition: d.condition,
    shipsTo: d.shipsTo,
    hasMeasurements: d.hasMeasurements,
    photoId: d.photoId,
    hazards: d.hazards,
    exportControlled: d.exportControlled,
  };
}
