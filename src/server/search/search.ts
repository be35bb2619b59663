/**
 * Text search and goal search over the catalogue: filters and facet counts, the goal evaluated over
 * every candidate of the mode's categories, ranking (passes first, then worst-case headroom, then
 * price) and one page of results, each with its full fit-engine result and a small plot.
 */
import type { GoalResult } from '../../lib/fit';
import type { Category } from '../../lib/listings/constants';
import { DEFAULT_PAGE_SIZE, type Filters, type GoalSearchRequest, type TextSearchQuery } from '../../lib/schemas/search';
import type { Facets } from '../../lib/search/facets';
import type {
  Detail,
  GoalSearchResponse,
  GoalSearchResult,
  Headline,
  PlotData,
  ResultFit,
  TextSearchResponse,
} from '../../lib/search/results';
import type { Catalogue } from './catalogue';
import { listingSummary, type SearchDoc } from './documents';
import { FacetCounter, filterMasks } from './facets';
import {
  bestTwoListingPairs,
  cavityFigureLabel,
  cavityHeadline,
  cavityKey,
  cavityPlot,
  cavityQuery,
  evaluateCavity,
  pairKey,
  toCavityGoal,
  type MirrorCandidate,
  type MirrorPrep,
} from './goals/cavity';
import {
  countingFigureLabel,
  countingHeadline,
  countingKey,
  countingPlot,
  countingQuery,
  evaluateCounting,
  type CounterPrep,
} from './goals/counting';
import { evaluateLaser, laserFigureLabel, laserHeadline, laserKey, laserPlot, laserQuery, type LaserPrep } from './goals/laser';
import { cavityDetails, countingDetails, laserDetails, squeezingDetails } from './goals/details';
import { mirrorAt } from './goals/prepare';
import { BLOCKED, compareKeys, keyOf, type RankKey } from './goals/rank';
import { evaluateSqueezing, squeezingHeadline, squeezingKey, squeezingPlot, squeezingQuery, type DetectorPrep } from './goals/squeezing';
import { hasWords, searchText } from './text';

/** two-listings answers this many best pairs at most (they page like any result list). */
export const MAX_PAIRS = 100;

/** A mirror with values at the wavelength, ready to be paired. */
const WITH_VALUES: RankKey = { rank: 0, headroom: 0 };

function pageOf<T>(items: readonly T[], page: number, size: number): T[] {
  return items.slice((page - 1) * size, page * size);
}

function filtersOf(q: TextSearchQuery): Filters {
  return { category: q.category, condition: q.condition, band: q.band, price: q.price, region: q.region, measured: q.measured };
}

export function textSearch(cat: Catalogue, q: TextSearchQuery): TextSearchResponse {
  const counter = new FacetCounter(filterMasks(filtersOf(q)));
  const words = hasWords(q.q) ? q.q : null;
  const sort = q.sort ?? (words ? 'relevance' : 'newest');
  const hits: { slot: number; score: number | null }[] = [];
  if (words) {
    for (const r of searchText(cat.text, words)) if (counter.add(cat.masks, r.slot)) hits.push({ slot: r.slot, score: r.score });
    const at = cat.approvedAt;
    const price = cat.euroCents;
    // best match first; equal scores (words in the title, for very common words) newest first
    if (sort === 'relevance') hits.sort((a, b) => b.score! - a.score! || at[b.slot]! - at[a.slot]!);
    if (sort === 'newest') hits.sort((a, b) => at[b.slot]! - at[a.slot]!);
    if (sort === 'price-asc') hits.sort((a, b) => price[a.slot]! - price[b.slot]!);
    if (sort === 'price-desc') hits.sort((a, b) => price[b.slot]! - price[a.slot]!);
  } else {
    const order = sort === 'price-asc' || sort === 'price-desc' ? cat.byPrice() : cat.byNewest();
    const n = order.length;
    for (let i = 0; i < n; i++) {
      const slot = order[sort === 'price-desc' ? n - 1 - i : i] as number;
      if (counter.add(cat.masks, slot)) hits.push({ slot, score: null });
    }
  }
  return {
    results: pageOf(hits, q.page, q.pageSize).map((h) => ({ listing: listingSummary(cat.doc(h.slot)), score: h.score })),
    total: hits.length,
    page: q.page,
    pageSize: q.pageSize,
    facets: counter.result(),
  };
}

/** One goal mode over the catalogue: which listings it considers and how it judges one. */
interface Plan {
  categories: Category[];
  /** A pair from one listing needs two units in stock. */
  minQuantity: number;
  /** Listings without possible values at this wavelength do not fit and need no evaluation; null to judge every one. */
  nm: number | null;
  key(slot: number): RankKey;
  evaluate(slot: number): GoalResult;
  plot(slot: number): PlotData | null;
  label(r: GoalResult): string;
  details(r: GoalResult): Detail[];
  headline: Headline[];
}

/** Builds the mode's plan; a FitInputError here comes from the buyer's goal. */
function planFor(cat: Catalogue, req: GoalSearchRequest): Plan {
  switch (req.mode) {
    case 'cavity': {
      const q = cavityQuery(toCavityGoal(req.goal));
      const mirror = (s: number) => cat.prep(s) as MirrorPrep;
      return {
        categories: ['cavity-mirror'],
        minQuantity: req.goal.configuration === 'pair' ? 2 : 1,
        nm: q.lambdaNm,
        // two-listings ranks pairs, not listings: here a mirror only needs values at the wavelength
        key:
          req.goal.configuration === 'two-listings'
            ? (s) => (mirrorAt(mirror(s), q.lambdaNm) === null ? BLOCKED : WITH_VALUES)
            : (s) => cavityKey(q, mirror(s)),
        evaluate: (s) => evaluateCavity(q, mirror(s).spec),
        plot: (s) => cavityPlot(q, mirror(s)),
        label: () => cavityFigureLabel(q),
        details: cavityDetails,
        headline: cavityHeadline(q),
      };
    }
    case 'squeezing': {
      const q = squeezingQuery(req.goal);
      const detector = (s: number) => cat.prep(s) as DetectorPrep;
      return {
        categories: ['photodiode', 'balanced-detector'],
        minQuantity: 1,
        nm: req.goal.wavelengthNm,
        key: (s) => squeezingKey(q, detector(s)),
        evaluate: (s) => evaluateSqueezing(q, detector(s).spec),
        plot: (s) => squeezingPlot(q, detector(s)),
        label: () => 'Predicted measured squeezing',
        details: squeezingDetails,
        headline: squeezingHeadline(q),
      };
    }
    case 'counting': {
      const q = countingQuery(req.goal);
      const counter = (s: number) => cat.prep(s) as CounterPrep;
      return {
        categories: ['single-photon-detector'],
        minQuantity: 1,
        nm: req.goal.wavelengthNm,
        key: (s) => countingKey(q, counter(s)),
        evaluate: (s) => evaluateCounting(q, counter(s).spec),
        plot: (s) => countingPlot(q, counter(s)),
        label: countingFigureLabel,
        details: countingDetails,
        headline: countingHeadline(q),
      };
    }
    case 'laser': {
      const q = laserQuery(req.goal);
      const laser = (s: number) => cat.prep(s) as LaserPrep;
      return {
        categories: ['laser'],
        minQuantity: 1,
        nm: null,
        key: (s) => laserKey(q, laser(s)),
        evaluate: (s) => evaluateLaser(q, laser(s).spec),
        plot: (s) => laserPlot(q, laser(s)),
        label: laserFigureLabel,
        details: laserDetails,
        headline: laserHeadline(q),
      };
    }
  }
}

function resultFit(r: GoalResult, figureLabel: string, details: Detail[], plot: PlotData | null): ResultFit {
  return {
    pass: r.pass,
    verdict: r.verdict,
    figure: r.figure,
    worst: r.worst,
    goal: r.goal,
    headroom: r.headroom,
    unit: r.unit,
    reasons: r.reasons,
    notes: r.notes,
    formula: r.formula,
    source: r.source,
    figureLabel,
    details,
    plot,
  };
}

/** Slots matching the words, marked 1 in an array indexed by slot; null without words. */
function textMarks(cat: Catalogue, q: string | undefined): Uint8Array | null {
  if (!hasWords(q)) return null;
  const marks = new Uint8Array(cat.capacity);
  for (const r of searchText(cat.text, q)) marks[r.slot] = 1;
  return marks;
}

interface Candidates {
  /** Every listing after stock, words and filters: the total. */
  count: number;
  /** Those that may have values at the goal's wavelength, with their rank keys. */
  scored: { slot: number; key: RankKey }[];
  /** The others, and those whose key has no headroom: does not fit, ranked by price. */
  unscored: number[];
  facets: Facets;
}

/**
 * The goal over every candidate of the mode: the one loop a goal search spends its time in. Without
 * words or filters the facet counts depend only on the mode's candidates, so the catalogue keeps them
 * until its next change.
 */
function candidates(cat: Catalogue, plan: Plan, q: string | undefined, filters: Filters | undefined): Candidates {
  const wanted = filterMasks(filters);
  const marks = textMarks(cat, q);
  const cacheKey = marks === null && wanted.every((m) => m === 0) ? `${plan.categories.join('|')}:${plan.minQuantity}` : null;
  const cached = cacheKey === null ? undefined : cat.facetsFor(cacheKey);
  const counter = cached === undefined ? new FacetCounter(wanted) : null;
  const { masks, quantity, coverLo, coverHi } = cat;
  const nm = plan.nm;
  const minQuantity = plan.minQuantity;
  const slots = cat.slotsIn(plan.categories);
  const scored: { slot: number; key: RankKey }[] = [];
  const unscored: number[] = [];
  let count = 0;
  for (let i = 0; i < slots.length; i++) {
    const s = slots[i]!;
    if (quantity[s]! < minQuantity) continue;
    if (marks !== null && marks[s] !== 1) continue;
    if (counter !== null && !counter.add(masks, s)) continue;
    count++;
    if (nm !== null && !(coverLo[s]! <= nm && nm <= coverHi[s]!)) {
      unscored.push(s);
      continue;
    }
    const key = plan.key(s);
    if (key.headroom === null && key.rank === 0) unscored.push(s);
    else scored.push({ slot: s, key });
  }
  const facets = cached ?? counter!.result();
  if (cacheKey !== null && cached === undefined) cat.keepFacets(cacheKey, facets);
  return { count, scored, unscored, facets };
}

export function goalSearch(cat: Catalogue, req: GoalSearchRequest): GoalSearchResponse {
  const page = req.page ?? 1;
  const size = req.pageSize ?? DEFAULT_PAGE_SIZE;
  const plan = planFor(cat, req);
  if (req.mode === 'cavity' && req.goal.configuration === 'two-listings') return twoListings(cat, req, plan, page, size);
  const { count, scored, unscored, facets } = candidates(cat, plan, req.q, req.filters);
  const price = cat.euroCents;
  let ordered: number[];
  if (req.sort === 'price') {
    const all = [...scored, ...unscored.map((slot) => ({ slot, key: { rank: 0, headroom: null } }))];
    all.sort((a, b) => b.key.rank - a.key.rank || price[a.slot]! - price[b.slot]! || a.slot - b.slot);
    ordered = pageOf(all, page, size).map((x) => x.slot);
  } else {
    scored.sort((a, b) => compareKeys(a.key, b.key) || price[a.slot]! - price[b.slot]! || a.slot - b.slot);
    const from = (page - 1) * size;
    const to = page * size;
    ordered = scored.slice(from, to).map((x) => x.slot);
    if (ordered.length < size && to > scored.length)
      ordered.push(...cheapestFirst(cat, unscored, Math.max(0, from - scored.length), to - scored.length));
  }
  return {
    results: ordered.map((s) => {
      const r = plan.evaluate(s);
      return { listing: listingSummary(cat.doc(s)), fit: resultFit(r, plan.label(r), plan.details(r), plan.plot(s)) };
    }),
    total: count,
    page,
    pageSize: size,
    facets,
    headline: plan.headline,
  };
}

/** Positions [from, to) of `slots` in price order, read off the catalogue's price order instead of sorting them. */
function cheapestFirst(cat: Catalogue, slots: readonly number[], from: number, to: number): number[] {
  if (slots.length === 0 || to <= 0) return [];
  const wanted = new Uint8Array(cat.capacity);
  for (const s of slots) wanted[s] = 1;
  const out: number[] = [];
  let seen = 0;
  for (const s of cat.byPrice()) {
    if (wanted[s] !== 1) continue;
    if (seen >= from) out.push(s);
    if (++seen >= to) break;
  }
  return out;
}

function twoListings(
  cat: Catalogue,
  req: Extract<GoalSearchRequest, { mode: 'cavity' }>,
  plan: Plan,
  page: number,
  size: number,
): GoalSearchResponse {
  const q = cavityQuery(toCavityGoal(req.goal));
  const mirrors: MirrorCandidate[] = [];
  const slotOf: number[] = [];
  const collect: Plan = {
    ...plan,
    key: (s) => {
      const prep = cat.prep(s) as MirrorPrep;
      const reading = mirrorAt(prep, q.lambdaNm);
      if (reading === null) return BLOCKED;
      mirrors.push({ prep, reading });
      slotOf.push(s);
      return WITH_VALUES;
    },
  };
  const { facets } = candidates(cat, collect, req.q, req.filters);
  const pairs = bestTwoListingPairs(q, mirrors, MAX_PAIRS).map((p) => {
    const a = slotOf[p.a]!;
    const b = slotOf[p.b]!;
    return { a, b, result: p.result, key: keyOf(p.result), price: cat.euroCents[a]! + cat.euroCents[b]! };
  });
  if (req.sort === 'price') pairs.sort((x, y) => y.key.rank - x.key.rank || x.price - y.price);
  else pairs.sort((x, y) => compareKeys(x.key, y.key) || x.price - y.price);
  const results: GoalSearchResult[] = pageOf(pairs, page, size).map((p) => ({
    listing: listingSummary(cat.doc(p.a)),
    partner: listingSummary(cat.doc(p.b)),
    fit: resultFit(
      p.result,
      cavityFigureLabel(q),
      cavityDetails(p.result),
      cavityPlot(q, cat.prep(p.a) as MirrorPrep, cat.prep(p.b) as MirrorPrep),
    ),
  }));
  return { results, total: pairs.length, page, pageSize: size, facets, headline: cavityHeadline(q) };
}

export interface ListingFit {
  result: GoalResult;
  figureLabel: string;
  partner: SearchDoc | null;
}

/** Whether the listing is among the goal search's candidates (mode's categories, stock, words, filters). */
function isCandidate(cat: Catalogue, plan: Plan, req: GoalSearchRequest, slot: number): boolean {
  if (!plan.categories.includes(cat.doc(slot).category) || cat.quantity[slot]! < plan.minQuantity) return false;
  if (hasWords(req.q) && !searchText(cat.text, req.q).some((r) => r.slot === slot)) return false;
  return new FacetCounter(filterMasks(req.filters)).add(cat.masks, slot);
}

/**
 * Whether one listing meets a goal search (for saved searches): its fit when it passes, else null.
 * In two-listings the listing is paired with its best partner among the other candidates.
 */
export function fitOfListing(cat: Catalogue, req: GoalSearchRequest, listingId: string): ListingFit | null {
  const slot = cat.slot(listingId);
  if (slot === undefined) return null;
  const plan = planFor(cat, req);
  if (!isCandidate(cat, plan, req, slot)) return null;
  if (req.mode === 'cavity' && req.goal.configuration === 'two-listings') {
    const q = cavityQuery(toCavityGoal(req.goal));
    const mine = mirrorAt(cat.prep(slot) as MirrorPrep, q.lambdaNm);
    if (mine === null) return null;
    let best: { slot: number; key: RankKey } | null = null;
    for (const { slot: s } of candidates(cat, plan, req.q, req.filters).scored) {
      if (s === slot) continue;
      const other = mirrorAt(cat.prep(s) as MirrorPrep, q.lambdaNm);
      if (other === null) continue;
      const key = pairKey(q, mine, other);
      if (key.rank === 2 && (best === null || compareKeys(key, best.key) < 0)) best = { slot: s, key };
    }
    if (best === null) return null;
    const result = evaluateCavity(q, (cat.prep(slot) as MirrorPrep).spec, (cat.prep(best.slot) as MirrorPrep).spec);
    return result.pass ? { result, figureLabel: cavityFigureLabel(q), partner: cat.doc(best.slot) } : null;
  }
  if (plan.key(slot).rank !== 2) return null;
  const result = plan.evaluate(slot);
  return result.pass ? { result, figureLabel: plan.label(result), partner: null } : null;
}

/** Whether one listing matches a text search's words and filters. */
export function matchesText(cat: Catalogue, q: string | undefined, filters: Filters | undefined, listingId: string): boolean {
  const slot = cat.slot(listingId);
  if (slot === undefined) return false;
  if (hasWords(q) && !searchText(cat.text, q).some((r) => r.slot === slot)) return false;
  return new FacetCounter(filterMasks(filters)).add(cat.masks, slot);
}
