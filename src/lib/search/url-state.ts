/**
 * The whole search in the page's address (shareable; the back button steps through searches): words,
 * mode, the goal form's values, filters, sort and page. The page reads it on the server for the first
 * render and the island keeps it in step with history.pushState.
 */
import {
  GOAL_MODES,
  GOAL_SORTS,
  TEXT_SORTS,
  type Filters,
  type GoalMode,
  type GoalSearchRequest,
  type GoalSort,
  type TextSort,
} from '../schemas/search';
import { FACETS, FACET_VALUES, type Facet } from './facets';
import { GOAL_FIELDS, goalRequest, initialValues, visibleFields, type GoalRequestResult, type Values } from './goal-forms';

export type SearchMode = 'text' | GoalMode;

export interface SearchState {
  mode: SearchMode;
  q: string;
  filters: Filters;
  sort: TextSort | GoalSort | null;
  page: number;
  /** The goal form of the mode (all of its fields; empty for words only). */
  values: Values;
}

const MAX_PAGE = 10_000;

export function emptyState(mode: SearchMode = 'text'): SearchState {
  return { mode, q: '', filters: {}, sort: null, page: 1, values: mode === 'text' ? {} : initialValues(mode) };
}

function readFilters(p: URLSearchParams): Filters {
  const out: Record<string, string[]> = {};
  for (const f of FACETS) {
    const allowed = new Set(FACET_VALUES[f].map((v) => v.value));
    const picked = [...new Set((p.get(f) ?? '').split(',').map((x) => x.trim()))].filter((x) => allowed.has(x));
    if (picked.length > 0) out[f] = picked;
  }
  return out as Filters;
}

export function parseSearchParams(p: URLSearchParams): SearchState {
  const m = p.get('mode');
  const mode: SearchMode = GOAL_MODES.includes(m as GoalMode) ? (m as GoalMode) : 'text';
  const sorts: readonly string[] = mode === 'text' ? TEXT_SORTS : GOAL_SORTS;
  const sort = p.get('sort');
  const page = Math.min(MAX_PAGE, Math.max(1, Math.floor(Number(p.get('page')) || 1)));
  const values: Values = mode === 'text' ? {} : initialValues(mode);
  if (mode !== 'text') for (const f of GOAL_FIELDS[mode]) if (p.has(f.key)) values[f.key] = (p.get(f.key) ?? '').slice(0, 40);
  return {
    mode,
    q: (p.get('q') ?? '').trim().slice(0, 200),
    filters: readFilters(p),
    sort: sort !== null && sorts.includes(sort) ? (sort as TextSort | GoalSort) : null,
    page,
    values,
  };
}

function writeFilters(u: URLSearchParams, filters: Filters): void {
  for (const f of FACETS) {
    const v = filters[f as Facet];
    if (v && v.length > 0) u.set(f, v.join(','));
  }
}

/** The address's query string: only what differs from a plain first page, and the goal's visible fields. */
export function toSearchParams(s: SearchState): URLSearchParams {
  const u = new URLSearchParams();
  if (s.q) u.set('q', s.q);
  if (s.mode !== 'text') {
    u.set('mode', s.mode);
    for (const f of visibleFields(s.mode, s.values)) {
      const v = s.values[f.key] ?? '';
      if (v !== '' || !f.optional) u.set(f.key, v);
    }
  }
  writeFilters(u, s.filters);
  if (s.sort) u.set('sort', s.sort);
  if (s.page > 1) u.set('page', String(s.page));
  return u;
}

export function searchPath(s: SearchState): string {
  const q = toSearchParams(s).toString();
  return q ? `/search?${q}` : '/search';
}

/** GET /api/search's query string for a words-only search. */
export function textQueryString(s: SearchState): string {
  const u = new URLSearchParams();
  if (s.q) u.set('q', s.q);
  writeFilters(u, s.filters);
  if (s.sort) u.set('sort', s.sort);
  if (s.page > 1) u.set('page', String(s.page));
  return u.toString();
}

/** The goal search request of a goal mode, or the form's problems. */
export function goalRequestOf(s: SearchState & { mode: GoalMode }): GoalRequestResult {
  return goalRequest(s.mode, s.values, {
    ...(s.q ? { q: s.q } : {}),
    ...(Object.keys(s.filters).length ? { filters: s.filters } : {}),
    ...(s.sort ? { sort: s.sort as GoalSort } : {}),
    ...(s.page > 1 ? { page: s.page } : {}),
  });
}

/** What the search page asks the API for a state: words only, a goal, or nothing yet (the form has problems). */
export type SearchRequest =
  | { kind: 'text'; qs: string }
  | { kind: 'goal'; body: GoalSearchRequest }
  | { kind: 'invalid'; errors: Record<string, string> };

export function searchRequestOf(s: SearchState): SearchRequest {
  if (s.mode === 'text') return { kind: 'text', qs: textQueryString(s) };
  const r = goalRequestOf({ ...s, mode: s.mode });
  return r.ok ? { kind: 'goal', body: r.request } : { kind: 'invalid', errors: r.errors };
}

/** Equal for equal requests: the query cache's key and the check that server-rendered results belong to the page. */
export function requestKey(r: SearchRequest): string {
  return JSON.stringify(r);
}
