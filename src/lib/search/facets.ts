/**
 * The facets of the search page: their values, labels and buckets, shared by the server (which
 * counts them) and the search island (which shows them). Price buckets and price sorting compare
 * listings in different currencies through rough reference rates; prices are always shown in the
 * seller's own currency.
 */
import { CATEGORIES, CATEGORY_LABELS, CONDITIONS, CONDITION_LABELS, REGIONS, REGION_LABELS } from '../listings/constants';
import type { Currency } from '../specs';

export const FACETS = ['category', 'condition', 'band', 'price', 'region', 'measured'] as const;
export type Facet = (typeof FACETS)[number];

export const FACET_LABELS: Record<Facet, string> = {
  category: 'Category',
  condition: 'Condition',
  band: 'Wavelength',
  price: 'Price (about, in EUR)',
  region: 'Ships to',
  measured: 'Measurement data',
};

/** Half-open wavelength buckets [minNm, maxNm); a listing counts in every bucket its wavelengths touch. */
export const WAVELENGTH_BANDS = [
  { value: 'uv', label: 'Ultraviolet, below 400 nm', minNm: 0, maxNm: 400 },
  { value: 'visible', label: 'Visible, 400–700 nm', minNm: 400, maxNm: 700 },
  { value: 'near-ir', label: 'Near infrared, 700–1000 nm', minNm: 700, maxNm: 1000 },
  { value: 'ir-1000', label: '1000–1400 nm', minNm: 1000, maxNm: 1400 },
  { value: 'telecom', label: 'Telecom, 1400–1700 nm', minNm: 1400, maxNm: 1700 },
  { value: 'mid-ir', label: 'Beyond 1700 nm', minNm: 1700, maxNm: Infinity },
] as const;
export type WavelengthBand = (typeof WAVELENGTH_BANDS)[number]['value'];
export const BAND_VALUES = WAVELENGTH_BANDS.map((b) => b.value) as [WavelengthBand, ...WavelengthBand[]];

/** Buckets on the euro-equivalent price in cents, [min, max). */
export const PRICE_BUCKETS = [
  { value: 'under-500', label: 'under €500', min: 0, max: 50_000 },
  { value: '500-2000', label: '€500–2 000', min: 50_000, max: 200_000 },
  { value: '2000-10000', label: '€2 000–10 000', min: 200_000, max: 1_000_000 },
  { value: 'over-10000', label: 'over €10 000', min: 1_000_000, max: Infinity },
] as const;
export type PriceBucket = (typeof PRICE_BUCKETS)[number]['value'];
export const PRICE_VALUES = PRICE_BUCKETS.map((b) => b.value) as [PriceBucket, ...PriceBucket[]];

export const MEASURED_VALUES = ['yes', 'no'] as const;
export type Measured = (typeof MEASURED_VALUES)[number];

/**
 * Units of each currency per euro, rounded: the magnitude of the ECB euro reference rates of 2024
 * (European Central Bank, "Euro foreign exchange reference rates"), values from memory, not looked
 * up. Only for sorting by price and
 * for the price buckets, where a few per cent do not matter; never for what a buyer pays.
 */
export const ROUGH_PER_EUR: Record<Currency, number> = {
  EUR: 1,
  USD: 1.08,
  GBP: 0.85,
  CHF: 0.95,
  JPY: 163,
  CAD: 1.48,
  AUD: 1.64,
  SEK: 11.4,
  NOK: 11.6,
  DKK: 7.46,
  PLN: 4.3,
  CNY: 7.8,
  KRW: 1460,
  SGD: 1.45,
  INR: 90,
};

/** Minor units per major unit (JPY and KRW have none). */
const MINOR_DIGITS: Partial<Record<Currency, number>> = { JPY: 0, KRW: 0 };

/** A price in euro cents, roughly, for sorting and bucketing. */
export function roughEuroCents(minor: number, currency: string): number {
  const per = ROUGH_PER_EUR[currency as Currency];
  if (per === undefined) return minor;
  const digits = MINOR_DIGITS[currency as Currency] ?? 2;
  return Math.round(((minor / 10 ** digits) * 100) / per);
}

export interface FacetValue {
  value: string;
  label: string;
  count: number;
}

export type Facets = Record<Facet, FacetValue[]>;

/** Every value of each facet with its label, in display order. */
export const FACET_VALUES: Record<Facet, { value: string; label: string }[]> = {
  category: CATEGORIES.map((c) => ({ value: c, label: CATEGORY_LABELS[c] })),
  condition: CONDITIONS.map((c) => ({ value: c, label: CONDITION_LABELS[c] })),
  band: WAVELENGTH_BANDS.map((b) => ({ value: b.value, label: b.label })),
  price: PRICE_BUCKETS.map((b) => ({ value: b.value, label: b.label })),
  region: REGIONS.map((r) => ({ value: r, label: r === 'WORLD' ? 'Anywhere (ships worldwide)' : REGION_LABELS[r] })),
  measured: [
    { value: 'yes', label: 'With measurement files' },
    { value: 'no', label: 'Specs only' },
  ],
};
