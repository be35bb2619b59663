/**
 * Facet membership as bit masks per listing, filters as masks per facet, and counts. Values of one
 * facet combine with OR, facets with AND; each facet's counts apply every other facet's filter but
 * not its own, so a buyer sees what ticking one more value would add.
 */
import { CATEGORIES, CONDITIONS, REGIONS } from '../../lib/listings/constants';
import type { Filters } from '../../lib/schemas/search';
import { FACETS, FACET_VALUES, MEASURED_VALUES, PRICE_BUCKETS, WAVELENGTH_BANDS, type Facet, type Facets } from '../../lib/search/facets';
import type { SearchDoc } from './documents';

export const FACET_COUNT = FACETS.length;

const VALUE_INDEX: Record<Facet, Map<string, number>> = Object.fromEntries(
  FACETS.map((f) => [f, new Map(FACET_VALUES[f].map((v, i) => [v.value, i]))]),
) as Record<Facet, Map<string, number>>;

const WORLD_BIT = 1 << REGIONS.indexOf('WORLD');
const ALL_REGIONS = (1 << REGIONS.length) - 1;

function bandMask(spans: readonly [number, number][]): number {
  let m = 0;
  WAVELENGTH_BANDS.forEach((b, i) => {
    if (spans.some(([lo, hi]) => lo < b.maxNm && hi >= b.minNm)) m |= 1 << i;
  });
  return m;
}

function priceMask(euroCents: number): number {
  const i = PRICE_BUCKETS.findIndex((b) => euroCents >= b.min && euroCents < b.max);
  return i < 0 ? 0 : 1 << i;
}

/** A listing's masks in FACETS order. Shipping worldwide counts for every region. */
export function facetMasks(d: SearchDoc): number[] {
  let regions = 0;
  for (const r of d.shipsTo) regions |= 1 << REGIONS.indexOf(r);
  if (regions & WORLD_BIT) regions = ALL_REGIONS;
  return [
    1 << CATEGORIES.indexOf(d.category),
    1 << CONDITIONS.indexOf(d.condition),
    bandMask(d.wavelengths),
    priceMask(d.euroCents),
    regions,
    1 << MEASURED_VALUES.indexOf(d.hasMeasurements ? 'yes' : 'no'),
  ];
}

/** One mask per facet; 0 means the facet does not filter. */
export function filterMasks(filters: Filters | undefined): number[] {
  return FACETS.map((f) => {
    let m = 0;
    for (const v of filters?.[f] ?? []) {
      const i = VALUE_INDEX[f].get(v);
      if (i !== undefined) m |= 1 << i;
    }
    return m;
  });
}

function bump(c: Int32Array, mask: number): void {
  let m = mask;
  while (m !== 0) {
    const low = m & -m;
    c[31 - Math.clz32(low)]!++;
    m ^= low;
  }
}

/** Counts per facet value over the listings added, read out as the API's facets. */
export class FacetCounter {
  private readonly counts: Int32Array[] = FACETS.map((f) => new Int32Array(FACET_VALUES[f].length));
  private readonly want: Int32Array;

  constructor(filters: number[]) {
    this.want = Int32Array.from(filters);
  }

  /**
   * Counts a listing (its masks at masks[slot * FACET_COUNT + f]); true when it passes every filter
   * and so belongs to the results. A listing failing exactly one facet's filter still counts for
   * that facet: ticking one more of its values would bring it in.
   */
  add(masks: Int32Array, slot: number): boolean {
    const base = slot * FACET_COUNT;
    const want = this.want;
    let failed = 0;
    for (let f = 0; f < FACET_COUNT; f++) {
      const w = want[f]!;
      if (w !== 0 && (masks[base + f]! & w) === 0) failed |= 1 << f;
    }
    if (failed === 0) {
      for (let f = 0; f < FACET_COUNT; f++) bump(this.counts[f]!, masks[base + f]!);
      return true;
    }
    if ((failed & (failed - 1)) === 0) {
      const f = 31 - Math.clz32(failed);
      bump(this.counts[f]!, masks[base + f]!);
    }
    return false;
  }

  result(): Facets {
    return Object.fromEntries(FACETS.map((f, i) => [f, FACET_VALUES[f].map((v, j) => ({ ...v, count: this.counts[i]![j]! }))])) as Facets;
  }
}
