import type { Region } from './listings/constants';

const EU = new Set([
  'AT',
  'BE',
  'BG',
  'HR',
  'CY',
  'CZ',
  'DK',
  'EE',
  'FI',
  'FR',
  'DE',
  'GR',
  'HU',
  'IE',
  'IT',
  'LV',
  'LT',
  'LU',
  'MT',
  'NL',
  'PL',
  'PT',
  'RO',
  'SK',
  'SI',
  'ES',
  'SE',
]);
const APAC = new Set(['AU', 'NZ', 'JP', 'KR', 'CN', 'TW', 'HK', 'SG', 'IN', 'MY', 'TH', 'VN', 'ID', 'PH']);

/** The shipping region of a two-letter country code; null where none of ours applies (only WORLD ships there). */
export function regionOfCountry(country: string): Region | null {
  const c = country.toUpperCase();
  if (EU.has(c)) return 'EU';
  if (c === 'GB') return 'UK';
  if (c === 'US') return 'US';
  if (c === 'CA') return 'CA';
  if (APAC.has(c)) return 'APAC';
  return null;
}

export function shipsTo(regions: readonly Region[], destination: Region | null): boolean {
  return regions.includes('WORLD') || (destination !== null && regions.includes(destination));
}
