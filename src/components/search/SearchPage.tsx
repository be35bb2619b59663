import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState } from 'react';
import { api, ApiError } from '../../lib/api-client';
import { GOAL_MODES, type GoalMode, type GoalSearchRequest, type TextSearchRequest } from '../../lib/schemas/search';
import type { Facet } from '../../lib/search/facets';
import { describeGoal, fieldForPath, initialValues, MODE_LABELS, type Values } from '../../lib/search/goal-forms';
import type { GoalSearchResponse, TextSearchResponse } from '../../lib/search/results';
import { parseSearchParams, requestKey, searchPath, searchRequestOf, type SearchMode, type SearchState } from '../../lib/search/url-state';
import { QueryRoot } from '../forms/QueryRoot';
import { FacetPanel } from './FacetPanel';
import { GoalForm } from './GoalForm';
import { GoalResultItem } from './GoalResultItem';
import { SaveSearch } from './SaveSearch';
import { TextResultCard } from './TextResultCard';
import { WavelengthChip } from './WavelengthChip';

export type SearchData = { kind: 'text'; data: TextSearchResponse } | { kind: 'goal'; data: GoalSearchResponse };

interface Props {
  initialState: SearchState;
  /** The server-rendered results and the request they answer. */
  initial: { key: string; result: SearchData } | null;
  signedIn: boolean;
}

const MODES: SearchMode[] = ['text', ...GOAL_MODES];

function allValues(s: SearchState): Record<GoalMode, Values> {
  const v = Object.fromEntries(GOAL_MODES.map((m) => [m, initialValues(m)])) as Record<GoalMode, Values>;
  if (s.mode !== 'text') v[s.mode] = s.values;
  return v;
}

function goalWavelength(s: SearchState): number | null {
  const nm = Number(s.mode === 'laser' && s.values.wlKind === 'range' ? s.values.wlMin : s.values.wl);
  return s.mode !== 'text' && Number.isFinite(nm) && nm > 0 ? nm : null;
}

function SearchApp({ initialState, initial, signedIn }: Props) {
  const [applied, setApplied] = useState(initialState);
  const [draftMode, setDraftMode] = useState<SearchMode>(initialState.mode);
  const [draftQ, setDraftQ] = useState(initialState.q);
  const [draftValues, setDraftValues] = useState(() => allValues(initialState));
  const [formErrors, setFormErrors] = useState<Record<string, string>>(() => {
    const r = searchRequestOf(initialState);
    return r.kind === 'invalid' ? r.errors : {};
  });
  const [showFilters, setShowFilters] = useState(false);

  useEffect(() => {
    const onPop = () => {
      const s = parseSearchParams(new URLSearchParams(window.location.search));
      setApplied(s);
      setDraftMode(s.mode);
      setDraftQ(s.q);
      setDraftValues((v) => (s.mode === 'text' ? v : { ...v, [s.mode]: s.values }));
      setFormErrors({});
    };
    window.addEventListener('popstate', onPop);
    return () => window.removeEventListener('popstate', onPop);
  }, []);

  const request = useMemo(() => searchRequestOf(applied), [applied]);
  const key = requestKey(request);
  const query = useQuery<SearchData, Error>({
    queryKey: ['search', key],
    queryFn: async () =>
      request.kind === 'text'
        ? { kind: 'text', data: await api<TextSearchResponse>(`/api/search${request.qs ? `?${request.qs}` : ''}`) }
        : {
            kind: 'goal',
            data: await api<GoalSearchResponse>('/api/search/goal', { body: (request as { body: GoalSearchRequest }).body }),
          },
    enabled: request.kind !== 'invalid',
    placeholderData: keepPreviousData,
    initialData: initial && initial.key === key ? initial.result : undefined,
    staleTime: 30_000,
  });

  const go = (next: SearchState) => {
    window.history.pushState(null, '', searchPath(next));
    const header = document.getElementById('site-search') as HTMLInputElement | null;
    if (header) header.value = next.q;
    setApplied(next);
  };

  const submit = () => {
    const sameMode = draftMode === applied.mode;
    const next: SearchState = {
      mode: draftMode,
      q: draftQ.trim(),
      filters: sameMode ? applied.filters : {},
      sort: sameMode ? applied.sort : null,
      page: 1,
      values: draftMode === 'text' ? {} : draftValues[draftMode],
    };
    const r = searchRequestOf(next);
    setFormErrors(r.kind === 'invalid' ? r.errors : {});
    if (r.kind !== 'invalid') go(next);
  };

  const toggle = (facet: Facet, value: string) => {
    const current: string[] = applied.filters[facet] ?? [];
    const nextValues = current.includes(value) ? current.filter((v) => v !== value) : [...current, value];
    const filters = { ...applied.filters, [facet]: nextValues };
    if (nextValues.length === 0) delete filters[facet];
    go({ ...applied, filters, page: 1 });
  };

  // a 400/422 on the goal: the server's own words, on the field they concern
  const serverErrors = useMemo(() => {
    const e = query.error;
    if (!(e instanceof ApiError) || applied.mode === 'text' || !e.fields) return {};
    const mode = applied.mode;
    return Object.fromEntries(Object.entries(e.fields).map(([path, msg]) => [fieldForPath(mode, path) ?? '_', msg]));
  }, [query.error, applied.mode]);
  const errors = draftMode === applied.mode ? { ...serverErrors, ...formErrors } : formErrors;

  const result = query.data;
  const shown = result && (result.kind === 'text') === (applied.mode === 'text') ? result : undefined;
  const data = shown?.data;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const nm = goalWavelength(applied);
  const saved: TextSearchRequest | GoalSearchRequest | null =
    request.kind === 'goal'
      ? (({ page: _page, pageSize: _size, ...rest }) => rest)(request.body)
      : request.kind === 'text' && (applied.q || Object.keys(applied.filters).length > 0)
        ? {
            mode: 'text',
            ...(applied.q ? { q: applied.q } : {}),
            ...(Object.keys(applied.filters).length ? { filters: applied.filters } : {}),
            ...(applied.sort ? { sort: applied.sort as TextSearchRequest['sort'] } : {}),
          }
        : null;
  const savedName = applied.mode === 'text' ? applied.q || 'Filtered listings' : describeGoal(applied.mode, applied.values);

  return (
    <div>
      <form
        role="search"
        aria-label="Goal search"
        className="sheet p-4"
        onSubmit={(e) => {
          e.preventDefault();
          submit();
        }}
      >
        <fieldset>
          <legend className="mb-2 text-sm font-semibold">What do you need?</legend>
          <div className="mb-3 flex flex-wrap gap-1.5">
            {MODES.map((m) => (
              <button
                key={m}
                type="button"
                aria-pressed={draftMode === m}
                className={`btn text-sm ${draftMode === m ? 'btn-primary' : 'btn-quiet'}`}
                onClick={() => {
                  setDraftMode(m);
                  setFormErrors({});
                }}
              >
                {MODE_LABELS[m]}
              </button>
            ))}
          </div>
        </fieldset>
        <div className="mb-3">
          <label className="field-label" htmlFor="search-q">
            {draftMode === 'text' ? 'Words' : 'Words (optional, to narrow the candidates)'}
          </label>
          <input
            id="search-q"
            type="search"
            className="field-input"
            value={draftQ}
            maxLength={200}
            placeholder="e.g. 780 nm supermirror"
            onChange={(e) => setDraftQ(e.target.value)}
          />
        </div>
        {draftMode !== 'text' && (
          <GoalForm
            mode={draftMode}
            values={draftValues[draftMode]}
            errors={errors}
            onChange={(k, v) => setDraftValues((all) => ({ ...all, [draftMode]: { ...all[draftMode], [k]: v } }))}
          />
        )}
        {errors._ && (
          <p className="field-error" role="alert">
            {errors._}
          </p>
        )}
        <div className="mt-4 flex flex-wrap items-center gap-3">
          <button type="submit" className="btn btn-primary">
            {draftMode === 'text' ? 'Search' : 'Find parts that fit'}
          </button>
          {draftMode !== 'text' && (
            <span className="text-sm text-ink-soft">
              Every candidate is computed: the figure, its worst case from the tolerances, and the headroom.
            </span>
          )}
        </div>
      </form>

      {shown?.kind === 'goal' && shown.data.headline.length > 0 && (
        <section
          className="mt-4 rounded-md border border-rule bg-white p-3 text-sm"
          aria-label="What the goal asks of a part"
          data-testid="headline"
        >
          <p className="mb-1 font-semibold">
            Your goal{' '}
            {nm !== null && (
              <>
                at <WavelengthChip nm={nm} />
              </>
            )}{' '}
            asks for
          </p>
          <dl className="grid gap-x-4 gap-y-0.5 sm:grid-cols-[auto_minmax(0,1fr)]">
            {shown.data.headline.map((h) => (
              <div key={h.label} className="contents">
                <dt className="text-ink-soft">{h.label}</dt>
                <dd className="num font-medium">{h.value}</dd>
              </div>
            ))}
          </dl>
        </section>
      )}

      <div className="mt-5 grid gap-6 md:grid-cols-[13rem_minmax(0,1fr)]">
        <aside aria-label="Filters">
          <button
            type="button"
            className="btn btn-quiet mb-3 w-full text-sm md:hidden"
            aria-expanded={showFilters}
            onClick={() => setShowFilters((s) => !s)}
          >
            {showFilters ? 'Hide filters' : 'Filters'}
          </button>
          <div className={showFilters ? 'block' : 'hidden md:block'}>
            {data && (
              <FacetPanel
                facets={data.facets}
                filters={applied.filters}
                onToggle={toggle}
                onClear={() => go({ ...applied, filters: {}, page: 1 })}
              />
            )}
          </div>
        </aside>

        <section aria-label="Results" aria-busy={query.isFetching} className="min-w-0">
          <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
            <p className="text-sm text-ink-soft" data-testid="result-count" aria-live="polite">
              {data ? (
                <>
                  <span className="num font-semibold text-ink">{data.total}</span>{' '}
                  {applied.mode === 'cavity' && applied.values.config === 'two-listings'
                    ? `best pair${data.total === 1 ? '' : 's'}`
                    : `listing${data.total === 1 ? '' : 's'}`}
                  {applied.mode !== 'text' && ' judged against your goal'}
                  {query.isFetching && ' · updating…'}
                </>
              ) : query.isFetching ? (
                'Searching…'
              ) : null}
            </p>
            <div className="flex flex-wrap items-center gap-2">
              <label className="text-sm" htmlFor="search-sort">
                Sort
              </label>
              <select
                id="search-sort"
                className="field-input w-auto max-w-[14rem] py-1 text-sm"
                value={applied.sort ?? (applied.mode === 'text' ? (applied.q ? 'relevance' : 'newest') : 'fit')}
                onChange={(e) => go({ ...applied, sort: e.target.value as SearchState['sort'], page: 1 })}
              >
                {applied.mode === 'text' ? (
                  <>
                    {applied.q && <option value="relevance">best match</option>}
                    <option value="newest">newest</option>
                    <option value="price-asc">price, low to high</option>
                    <option value="price-desc">price, high to low</option>
                  </>
                ) : (
                  <>
                    <option value="fit">best fit first</option>
                    <option value="price">fits first, then cheapest</option>
                  </>
                )}
              </select>
            </div>
          </div>
          <div className="mb-4">
            <SaveSearch
              key={searchPath({ ...applied, page: 1 })}
              signedIn={signedIn}
              search={saved}
              url={searchPath({ ...applied, page: 1 })}
              suggestedName={savedName}
            />
          </div>

          {query.isError && !(query.error instanceof ApiError && query.error.fields) && (
            <div className="notice notice-bad mb-4" role="alert">
              <p>{query.error.message}</p>
              <button type="button" className="btn btn-quiet mt-2 text-sm" onClick={() => void query.refetch()}>
                Try again
              </button>
            </div>
          )}
          {request.kind === 'invalid' && <p className="notice notice-warn">Check the goal above: some fields need attention.</p>}
          {!data && query.isFetching && <ResultSkeleton />}
          {data && data.total === 0 && (
            <p className="notice" role="status" data-testid="no-results">
              {applied.mode === 'text'
                ? `No live listing matches${applied.q ? ` “${applied.q}”` : ''}${Object.keys(applied.filters).length ? ' with these filters' : ''}. Try fewer words or clear the filters.`
                : applied.mode === 'cavity' && applied.values.config === 'two-listings'
                  ? 'No two listed mirrors have values at this wavelength and form a stable cavity at this length. Try another length, or a pair from one listing.'
                  : 'No live listing of this kind to judge against your goal with these words and filters. Clear the filters, or save the search to hear of new listings.'}
            </p>
          )}
          <div className={query.isPlaceholderData ? 'opacity-60' : undefined}>
            {shown?.kind === 'text' && (
              <div className="grid grid-cols-1 gap-4 sm:grid-cols-2 lg:grid-cols-3" data-testid="text-results">
                {shown.data.results.map((r) => (
                  <TextResultCard key={r.listing.id} l={r.listing} />
                ))}
              </div>
            )}
            {shown?.kind === 'goal' && (
              <ol className="space-y-4" data-testid="goal-results">
                {shown.data.results.map((r, i) => (
                  <li key={`${r.listing.id}+${r.partner?.id ?? ''}`}>
                    <GoalResultItem r={r} rank={(shown.data.page - 1) * shown.data.pageSize + i + 1} />
                  </li>
                ))}
              </ol>
            )}
          </div>
          {data && pages > 1 && (
            <nav aria-label="Pages" className="mt-6 flex flex-wrap items-center gap-3 text-sm">
              <button
                type="button"
                className="btn btn-quiet"
                disabled={applied.page <= 1}
                onClick={() => go({ ...applied, page: applied.page - 1 })}
              >
                ← Previous
              </button>
              <span className="num">
                Page {applied.page} of {pages}
              </span>
              <button
                type="button"
                className="btn btn-quiet"
                disabled={applied.page >= pages}
                onClick={() => go({ ...applied, page: applied.page + 1 })}
              >
                Next →
              </button>
            </nav>
          )}
        </section>
      </div>
    </div>
  );
}

function ResultSkeleton() {
  return (
    <div className="space-y-3" aria-hidden="true">
      {[0, 1, 2].map((i) => (
        <div key={i} className="h-28 rounded-lg border border-rule bg-sheet" />
      ))}
    </div>
  );
}

/** The search page: words, a goal form per mode, facets, sort and pages, the whole query in the address. */
export default function SearchPage(props: Props) {
  return (
    <QueryRoot>
      <SearchApp {...props} />
    </QueryRoot>
  );
}
