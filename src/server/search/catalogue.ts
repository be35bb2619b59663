/**
 * The in-memory catalogue the search runs on: every searchable listing in a slot; per slot in typed
 * arrays its facet masks, stock, rough euro price and the span of wavelengths where it may have fit
 * values (so a goal search skips most listings with two comparisons); its fit-engine input prepared
 * once; and the full-text index. It knows nothing of the database; live-index.ts keeps it in step.
 */
import type { Category } from '../../lib/listings/constants';
import type { Facets } from '../../lib/search/facets';
import type { SearchDoc } from './documents';
import { FACET_COUNT, facetMasks } from './facets';
import { envelope, prepare, type Prepared } from './goals/prepare';
import { createTextIndex, type TextIndex } from './text';

export class Catalogue {
  private docs: (SearchDoc | undefined)[] = [];
  private prepared: Prepared[] = [];
  private readonly slotOf = new Map<string, number>();
  private readonly free: number[] = [];
  masks = new Int32Array(64 * FACET_COUNT);
  quantity = new Int32Array(64);
  euroCents = new Float64Array(64);
  approvedAt = new Float64Array(64);
  /** Where the listing may have fit values, nm; NaN for nowhere. */
  coverLo = new Float64Array(64);
  coverHi = new Float64Array(64);
  readonly text: TextIndex = createTextIndex();
  private byCategory = new Map<string, Int32Array>();
  private newestOrder: number[] | null = null;
  private priceOrder: number[] | null = null;
  private readonly facetCache = new Map<string, Facets>();

  get size(): number {
    return this.slotOf.size;
  }

  has(id: string): boolean {
    return this.slotOf.has(id);
  }

  get(id: string): SearchDoc | undefined {
    const s = this.slotOf.get(id);
    return s === undefined ? undefined : this.docs[s];
  }

  slot(id: string): number | undefined {
    return this.slotOf.get(id);
  }

  doc(slot: number): SearchDoc {
    return this.docs[slot] as SearchDoc;
  }

  prep(slot: number): Prepared {
    return this.prepared[slot] as Prepared;
  }

  /** Every occupied slot. */
  slots(): IterableIterator<number> {
    return this.slotOf.values();
  }

  upsert(doc: SearchDoc): void {
    const existing = this.slotOf.get(doc.id);
    if (existing !== undefined) this.text.discard(existing);
    const slot = existing ?? this.free.pop() ?? this.docs.length;
    this.slotOf.set(doc.id, slot);
    this.docs[slot] = doc;
    const prep = prepare(doc);
    this.prepared[slot] = prep;
    if (slot >= this.quantity.length) this.grow(slot + 1);
    this.masks.set(facetMasks(doc), slot * FACET_COUNT);
    this.quantity[slot] = doc.quantity;
    this.euroCents[slot] = doc.euroCents;
    this.approvedAt[slot] = doc.approvedAt;
    const [lo, hi] = envelope(prep);
    this.coverLo[slot] = lo;
    this.coverHi[slot] = hi;
    this.text.add(doc, slot);
    this.changed();
  }

  remove(id: string): void {
    const slot = this.slotOf.get(id);
    if (slot === undefined) return;
    this.text.discard(slot);
    this.slotOf.delete(id);
    this.docs[slot] = undefined;
    this.prepared[slot] = null;
    this.masks.fill(0, slot * FACET_COUNT, (slot + 1) * FACET_COUNT);
    this.coverLo[slot] = NaN;
    this.coverHi[slot] = NaN;
    this.free.push(slot);
    this.changed();
  }

  /** Slots are never above this; arrays indexed by slot need this length. */
  get capacity(): number {
    return this.quantity.length;
  }

  private grow(minSlots: number): void {
    const n = Math.max(this.quantity.length * 2, minSlots);
    const widen = <T extends Int32Array | Float64Array>(a: T, make: (n: number) => T, per = 1): T => {
      const b = make(n * per);
      b.set(a);
      return b;
    };
    this.masks = widen(this.masks, (k) => new Int32Array(k), FACET_COUNT);
    this.quantity = widen(this.quantity, (k) => new Int32Array(k));
    this.euroCents = widen(this.euroCents, (k) => new Float64Array(k));
    this.approvedAt = widen(this.approvedAt, (k) => new Float64Array(k));
    this.coverLo = widen(this.coverLo, (k) => new Float64Array(k));
    this.coverHi = widen(this.coverHi, (k) => new Float64Array(k));
  }

  private changed(): void {
    this.byCategory = new Map();
    this.newestOrder = null;
    this.priceOrder = null;
    this.facetCache.clear();
  }

  /** Facet counts a search kept for this catalogue version (see search.ts: unfiltered candidate sets). */
  facetsFor(key: string): Facets | undefined {
    return this.facetCache.get(key);
  }

  keepFacets(key: string, facets: Facets): void {
    this.facetCache.set(key, facets);
  }

  /** Slots of these categories in slot order, cached until the next change. */
  slotsIn(categories: readonly Category[]): Int32Array {
    const key = categories.join('|');
    const cached = this.byCategory.get(key);
    if (cached) return cached;
    const want = new Set(categories);
    const out: number[] = [];
    for (const s of this.slotOf.values()) if (want.has((this.docs[s] as SearchDoc).category)) out.push(s);
    const slots = Int32Array.from(out).sort();
    this.byCategory.set(key, slots);
    return slots;
  }

  /** Every slot, newest approval first; cached until the next change. */
  byNewest(): number[] {
    const at = this.approvedAt;
    this.newestOrder ??= [...this.slotOf.values()].sort((a, b) => at[b]! - at[a]! || a - b);
    return this.newestOrder;
  }

  /** Every slot, cheapest first (rough euro price); cached until the next change. */
  byPrice(): number[] {
    const price = this.euroCents;
    this.priceOrder ??= [...this.slotOf.values()].sort((a, b) => price[a]! - price[b]! || a - b);
    return this.priceOrder;
  }
}
