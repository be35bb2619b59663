/**
 * The full-text part of the index: minisearch over each listing's title and the rest of its words
 * (category, specs as words, lab, description). Every word must match (AND); the last word matches as
 * a prefix while the buyer is still typing (words, not numbers: "100" should not find "1000"); a
 * longer word tolerates one typo.
 *
 * minisearch scores every listing holding a word, so a query would cost in proportion to its
 * commonest word. Beside it the index keeps, per word, the sorted list of listings holding it: the
 * query runs through minisearch with its most selective word only (BM25 ranking, prefix, typo
 * tolerance), and the other words are looked up in their lists, exactly (the last one as a prefix).
 * When even the most selective word is in thousands of listings ("mirror"), BM25 on it says little
 * and costs much: the lists are intersected instead, and listings with more of the words in the title
 * rank first.
 */
import MiniSearch from 'minisearch';
import type { SearchDoc } from './documents';

/**
 * Words too common in listings to narrow an AND search: English glue, and unit symbols, which nearly
 * every listing carries ("780 nm" finds listings at 780 whatever the unit).
 */
const STOPWORDS = new Set([
  ...['a', 'an', 'and', 'at', 'for', 'from', 'in', 'of', 'on', 'or', 'the', 'to', 'with'],
  ...['nm', 'µm', 'um', 'mm', 'cm', 'm', 'ppm', 'hz', 'khz', 'mhz', 'ghz', 'db', 'w', 'mw', 'µw', 's', 'ms', 'µs', 'ns', 'ps'],
]);

/** Between a listing's words in its word list, so "\u0001mirror\u0001" finds the whole word. */
const SEP = '\u0001';

/** Above this many listings for the most selective word, intersecting the lists beats scoring with minisearch. */
const BROAD = 3000;

/** Splits on spaces and punctuation and between digits and letters, so "780nm" finds "780 nm". */
export function tokenize(text: string): string[] {
  return text
    .split(/[\s\p{P}\p{S}]+/u)
    .flatMap((t) => t.split(/(?<=\d)(?=\p{L})|(?<=\p{L})(?=\d)/u))
    .filter((t) => t.length > 0);
}

function processTerm(term: string): string | null {
  const t = term.toLowerCase();
  return STOPWORDS.has(t) ? null : t;
}

/** The query's terms after tokenizing and stop words, as the index sees them. */
export function queryTerms(q: string): string[] {
  return tokenize(q)
    .map(processTerm)
    .filter((t): t is string => t !== null);
}

/** Whether the query has a word to search for (a query of stop words only filters nothing). */
export function hasWords(q: string | undefined): q is string {
  return q !== undefined && queryTerms(q).length > 0;
}

/** What minisearch indexes of a listing; its id is the listing's ordinal in this index. */
interface TextDoc {
  id: number;
  title: string;
  body: string;
}

/** A matching listing by its catalogue slot. */
export interface TextHit {
  slot: number;
  score: number;
}

/** Index of the first element ≥ x in a sorted array (numbers, or strings in code-unit order). */
function lowerBound<T extends number | string>(a: readonly T[], x: T): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid]! < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function has(sorted: readonly number[], x: number): boolean {
  const i = lowerBound(sorted, x);
  return i < sorted.length && sorted[i] === x;
}

/** Sorted union of sorted lists. */
function union(lists: readonly (readonly number[])[]): number[] {
  if (lists.length === 1) return lists[0] as number[];
  return [...new Set(lists.flat())].sort((a, b) => a - b);
}

export class TextIndex {
  private readonly ms = new MiniSearch<TextDoc>({ idField: 'id', fields: ['title', 'body'], storeFields: [], tokenize, processTerm });
  /** Per word, the ordinals of the listings holding it, ascending (ordinals only grow, so adding appends). */
  private readonly postings = new Map<string, number[]>();
  private vocabulary: string[] | null = null;
  private nextOrdinal = 0;
  private readonly ordinalOfSlot = new Map<number, number>();
  /** Per ordinal: the catalogue slot (−1 once discarded), the words, and the title's words between separators. */
  private readonly slotAt: number[] = [];
  private readonly wordsAt: string[][] = [];
  private readonly titleAt: string[] = [];

  add(d: SearchDoc, slot: number): void {
    const doc: TextDoc = { id: this.nextOrdinal++, title: d.title, body: `${d.categoryText} ${d.specsText} ${d.labName} ${d.description}` };
    const title = new Set(queryTerms(doc.title));
    const words = [...new Set([...title, ...queryTerms(doc.body)])];
    for (const w of words) {
      const list = this.postings.get(w);
      if (list) list.push(doc.id);
      else {
        this.postings.set(w, [doc.id]);
        this.vocabulary = null;
      }
    }
    this.ordinalOfSlot.set(slot, doc.id);
    this.slotAt[doc.id] = slot;
    this.wordsAt[doc.id] = words;
    this.titleAt[doc.id] = `${SEP}${[...title].join(SEP)}${SEP}`;
    this.ms.add(doc);
  }

  discard(slot: number): void {
    const ordinal = this.ordinalOfSlot.get(slot);
    if (ordinal === undefined) return;
    for (const w of this.wordsAt[ordinal] ?? []) {
      const list = this.postings.get(w);
      if (!list) continue;
      const i: number = lowerBound(list, ordinal);
      if (list[i] === ordinal) list.splice(i, 1);
      if (list.length === 0) {
        this.postings.delete(w);
        this.vocabulary = null;
      }
    }
    this.ordinalOfSlot.delete(slot);
    this.slotAt[ordinal] = -1;
    this.wordsAt[ordinal] = [];
    this.titleAt[ordinal] = '';
    this.ms.discard(ordinal);
  }

  /** The listings holding the word, or for a prefix any word starting with it. */
  private holding(term: string, prefix: boolean): number[] {
    if (!prefix) return this.postings.get(term) ?? [];
    this.vocabulary ??= [...this.postings.keys()].sort();
    const v = this.vocabulary;
    const lists: number[][] = [];
    for (let i = lowerBound(v, term); i < v.length && v[i]!.startsWith(term); i++) lists.push(this.postings.get(v[i]!)!);
    return lists.length === 0 ? [] : union(lists);
  }

  /** Matching listings, best first; empty when the query has no searchable word. */
  search(q: string): TextHit[] {
    const terms = queryTerms(q);
    if (terms.length === 0) return [];
    const last = terms.length - 1;
    const prefixAt = (i: number) => i === last && /^\p{L}{2,}$/u.test(terms[i] as string);
    const lists = terms.map((t, i) => this.holding(t, prefixAt(i)));
    let pivot = 0;
    lists.forEach((l, i) => {
      if (l.length < lists[pivot]!.length) pivot = i;
    });
    const others = lists.filter((_, i) => i !== pivot);
    if (lists[pivot]!.length > BROAD)
      return this.intersect(
        lists[pivot]!,
        others,
        terms.map((t, i) => (prefixAt(i) ? `${SEP}${t}` : `${SEP}${t}${SEP}`)),
      );
    const word = terms[pivot] as string;
    const hits = this.ms.search(word, {
      boost: { title: 3 },
      prefix: prefixAt(pivot),
      fuzzy: word.length >= 5 && /\p{L}/u.test(word) ? 0.2 : false,
      maxFuzzy: 1,
    });
    const out: TextHit[] = [];
    for (const h of hits) {
      const ordinal = h.id as number;
      const slot = this.slotAt[ordinal] ?? -1;
      if (slot >= 0 && others.every((l) => has(l, ordinal))) out.push({ slot, score: h.score });
    }
    return out;
  }

  /** The listings on every list; the score is how many of the words their title has. */
  private intersect(smallest: readonly number[], others: readonly (readonly number[])[], titleChecks: string[]): TextHit[] {
    const out: TextHit[] = [];
    for (const ordinal of smallest) {
      let all = true;
      for (const l of others) {
        if (!has(l, ordinal)) {
          all = false;
          break;
        }
      }
      const slot = this.slotAt[ordinal] ?? -1;
      if (!all || slot < 0) continue;
      const title = this.titleAt[ordinal]!;
      let score = 0;
      for (const c of titleChecks) if (title.includes(c)) score++;
      out.push({ slot, score });
    }
    return out.sort((a, b) => b.score - a.score);
  }
}

export function createTextIndex(): TextIndex {
  return new TextIndex();
}

export function searchText(index: TextIndex, q: string): TextHit[] {
  return index.search(q);
}
