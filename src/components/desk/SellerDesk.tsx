import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type FilterFn,
  type SortingState,
} from '@tanstack/react-table';
import { useEffect, useId, useMemo, useRef, useState, type SubmitEvent } from 'react';
import { api, ApiError } from '../../lib/api-client';
import { CATEGORY_LABELS, CONDITION_LABELS, LISTING_STATUSES, STATUS_LABELS, type ListingStatus } from '../../lib/listings/constants';
import { formatDate, formatMoney } from '../../lib/format';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';
import { LOCKED_STATUSES, STATUS_ORDER } from './labels';
import type { DeskListing, LabOption } from './types';

const QUERY_KEY = ['desk-listings'] as const;
const PAGE = 100;

/** Every listing of the caller's labs; the API pages at 100, the desk wants them all to sort and search. */
async function fetchAll(): Promise<DeskListing[]> {
  const all: DeskListing[] = [];
  for (;;) {
    const page = await api<{ total: number; items: DeskListing[] }>(`/api/listings?mine=1&limit=${PAGE}&offset=${all.length}`);
    all.push(...page.items);
    if (page.items.length === 0 || all.length >= page.total) return all;
  }
}

type StatusFilter = 'active' | 'all' | ListingStatus;

const statusFilter: FilterFn<DeskListing> = (row, _id, value: StatusFilter) => {
  const s = row.original.status;
  if (value === 'all') return true;
  if (value === 'active') return s !== 'archived';
  return s === value;
};

const searchFilter: FilterFn<DeskListing> = (row, _id, value: string) => {
  const l = row.original;
  const text = `${l.title} ${CATEGORY_LABELS[l.category]} ${STATUS_LABELS[l.status]} ${CONDITION_LABELS[l.condition]}`.toLowerCase();
  return value
    .toLowerCase()
    .split(/\s+/)
    .every((word) => text.includes(word));
};

function useReplaceListing() {
  const qc = useQueryClient();
  return (listing: DeskListing) => qc.setQueryData<DeskListing[]>(QUERY_KEY, (old) => old?.map((l) => (l.id === listing.id ? listing : l)));
}

function StatusCell({ listing }: { listing: DeskListing }) {
  const showReason = (listing.status === 'changes-requested' || listing.status === 'rejected') && listing.reviewReason;
  return (
    <div className="min-w-32">
      <span className="font-medium" data-testid="status">
        {STATUS_LABELS[listing.status]}
      </span>
      {listing.status === 'in-review' && listing.published && (
        <span className="block text-xs text-ink-faint">approved version still live</span>
      )}
      {showReason && (
        <p className="mt-0.5 max-w-64 text-xs text-ink-soft">
          <span className="sr-only">Moderator's reason: </span>“{listing.reviewReason}”
        </p>
      )}
    </div>
  );
}

function StockCell({ listing }: { listing: DeskListing }) {
  const replace = useReplaceListing();
  const qc = useQueryClient();
  const id = useId();
  const [text, setText] = useState(String(listing.quantity));
  useEffect(() => setText(String(listing.quantity)), [listing.quantity]);
  const m = useMutation<{ listing: DeskListing }, ApiError, number>({
    mutationFn: (quantity) =>
      api(`/api/listings/${encodeURIComponent(listing.id)}`, { method: 'PATCH', body: { quantity, version: listing.version } }),
    onSuccess: (res) => replace(res.listing),
    onError: (err) => {
      if (err.status === 409) void qc.invalidateQueries({ queryKey: QUERY_KEY });
    },
  });
  if (LOCKED_STATUSES.includes(listing.status)) return <span className="num">{listing.quantity}</span>;
  const wanted = Number(text);
  const valid = text.trim() !== '' && Number.isInteger(wanted) && wanted >= 0 && wanted <= 10_000;
  const changed = valid && wanted !== listing.quantity;
  const onSubmit = (e: SubmitEvent<HTMLFormElement>) => {
    e.preventDefault();
    if (changed) m.mutate(wanted);
  };
  return (
    <form onSubmit={onSubmit} className="flex min-w-36 flex-col gap-1">
      <div className="flex items-center gap-1">
        <label htmlFor={id} className="sr-only">
          Stock of {listing.title}
        </label>
        <input
          id={id}
          type="number"
          min={0}
          max={10000}
          step={1}
          inputMode="numeric"
          className="field-input num w-20 px-2 py-1 text-sm"
          value={text}
          aria-invalid={valid ? undefined : true}
          onChange={(e) => setText(e.target.value)}
        />
        {changed && (
          <button type="submit" className="btn btn-quiet px-2 py-0.5 text-sm" disabled={m.isPending}>
            Set
          </button>
        )}
      </div>
      {!valid && <span className="field-error">0 to 10 000, whole units.</span>}
      {m.error && (
        <span className="field-error" role="alert">
          {m.error.message}
        </span>
      )}
      {m.isSuccess && !changed && (
        <span className="text-xs text-good" role="status">
          <span aria-hidden="true">✓ </span>Saved
        </span>
      )}
    </form>
  );
}

type Announce = (kind: 'good' | 'bad', text: React.ReactNode) => void;

function ActionsCell({ listing, announce }: { listing: DeskListing; announce: Announce }) {
  const qc = useQueryClient();
  const replace = useReplaceListing();
  const [confirming, setConfirming] = useState(false);
  const confirmButton = useRef<HTMLButtonElement>(null);
  const archiveButton = useRef<HTMLButtonElement>(null);
  const asked = useRef(false);
  // Focus follows the question: onto "Yes, archive" when asked, back onto "Archive" when kept.
  useEffect(() => {
    if (confirming) confirmButton.current?.focus();
    else if (asked.current) archiveButton.current?.focus();
    asked.current = confirming;
  }, [confirming]);
  const duplicate = useMutation<{ id: string }, ApiError>({
    mutationFn: () => api(`/api/listings/${encodeURIComponent(listing.id)}/duplicate`, { method: 'POST' }),
    onSuccess: (res) => {
      void qc.invalidateQueries({ queryKey: QUERY_KEY });
      announce(
        'good',
        <>
          Copied “{listing.title}” as a new draft. <a href={`/desk/listings/${encodeURIComponent(res.id)}`}>Edit the copy</a>
        </>,
      );
    },
    onError: (err) => announce('bad', err.message),
  });
  const archive = useMutation<{ listing: DeskListing }, ApiError>({
    mutationFn: () => api(`/api/listings/${encodeURIComponent(listing.id)}`, { method: 'DELETE' }),
    onSuccess: (res) => {
      replace(res.listing);
      setConfirming(false);
      announce('good', `Archived “${listing.title}”. Buyers no longer see it.`);
    },
    onError: (err) => announce('bad', err.message),
  });
  if (confirming) {
    return (
      <div
        className="flex min-w-44 flex-col gap-1"
        role="group"
        aria-label={`Archive ${listing.title}?`}
        onKeyDown={(e) => {
          if (e.key === 'Escape') setConfirming(false);
        }}
      >
        <span className="text-xs">Archive it? Buyers will no longer see it.</span>
        <span className="flex gap-1">
          <button
            ref={confirmButton}
            type="button"
            className="btn btn-quiet px-2 py-0.5 text-sm text-bad"
            onClick={() => archive.mutate()}
            disabled={archive.isPending}
          >
            Yes, archive
          </button>
          <button type="button" className="btn btn-quiet px-2 py-0.5 text-sm" onClick={() => setConfirming(false)}>
            Keep
          </button>
        </span>
      </div>
    );
  }
  return (
    <div className="flex flex-wrap gap-1">
      <a
        className="btn btn-quiet px-2 py-0.5 text-sm"
        href={`/desk/listings/${encodeURIComponent(listing.id)}`}
        aria-label={`Edit ${listing.title}`}
      >
        {LOCKED_STATUSES.includes(listing.status) ? 'View' : 'Edit'}
      </a>
      <button
        type="button"
        className="btn btn-quiet px-2 py-0.5 text-sm"
        onClick={() => duplicate.mutate()}
        disabled={duplicate.isPending}
        aria-label={`Duplicate ${listing.title}`}
      >
        Duplicate
      </button>
      {listing.status !== 'archived' && (
        <button
          ref={archiveButton}
          type="button"
          className="btn btn-quiet px-2 py-0.5 text-sm"
          onClick={() => setConfirming(true)}
          aria-label={`Archive ${listing.title}`}
        >
          Archive
        </button>
      )}
    </div>
  );
}

const col = createColumnHelper<DeskListing>();
/** Titles as people read them: "780 nm" before "1064 nm", case ignored. */
const titleOrder = new Intl.Collator(undefined, { numeric: true, sensitivity: 'base' });

const STACKED_CELL =
  'max-sm:flex max-sm:items-baseline max-sm:gap-3 max-sm:border-0 max-sm:px-0 max-sm:py-1 max-sm:before:w-16 max-sm:before:shrink-0 max-sm:before:text-xs max-sm:before:text-ink-soft max-sm:before:content-[attr(data-label)]';

function ariaSort(s: false | 'asc' | 'desc') {
  return s === 'asc' ? 'ascending' : s === 'desc' ? 'descending' : undefined;
}

interface Props {
  initial: DeskListing[];
  labs: LabOption[];
}

function Desk({ initial, labs }: Props) {
  const listings = useQuery<DeskListing[], ApiError>({ queryKey: QUERY_KEY, queryFn: fetchAll, initialData: initial, staleTime: 30_000 });
  const [sorting, setSorting] = useState<SortingState>([{ id: 'updatedAt', desc: true }]);
  const [search, setSearch] = useState('');
  const [status, setStatus] = useState<StatusFilter>('active');
  const [message, setMessage] = useState<{ kind: 'good' | 'bad'; text: React.ReactNode } | null>(null);
  const labName = useMemo(() => new Map(labs.map((l) => [l.id, l.name])), [labs]);
  const announce: Announce = (kind, text) => setMessage({ kind, text });

  const columns = useMemo(
    () => [
      col.accessor('title', {
        header: 'Listing',
        sortingFn: (a, b) => titleOrder.compare(a.original.title, b.original.title),
        cell: (c) => {
          const l = c.row.original;
          return (
            <div className="min-w-48 max-w-80">
              <a href={`/desk/listings/${encodeURIComponent(l.id)}`} className="font-medium break-words">
                {l.title}
              </a>
              <span className="block text-xs text-ink-faint">
                {CATEGORY_LABELS[l.category]}
                {labs.length > 1 && ` · ${labName.get(l.labId) ?? ''}`}
              </span>
            </div>
          );
        },
      }),
      col.accessor('status', {
        header: 'Status',
        sortingFn: (a, b) => STATUS_ORDER[a.original.status] - STATUS_ORDER[b.original.status],
        filterFn: statusFilter,
        cell: (c) => <StatusCell listing={c.row.original} />,
      }),
      col.accessor('priceCents', {
        header: 'Price',
        cell: (c) => <span className="num whitespace-nowrap">{formatMoney(c.getValue(), c.row.original.currency)}</span>,
      }),
      col.accessor('quantity', { header: 'Stock', cell: (c) => <StockCell listing={c.row.original} /> }),
      col.accessor('updatedAt', {
        header: 'Updated',
        cell: (c) => <span className="num whitespace-nowrap">{formatDate(c.getValue())}</span>,
      }),
      col.display({ id: 'actions', header: 'Actions', cell: (c) => <ActionsCell listing={c.row.original} announce={announce} /> }),
    ],
    [labs.length, labName],
  );
  const columnFilters = useMemo<ColumnFiltersState>(() => [{ id: 'status', value: status }], [status]);
  const table = useReactTable({
    data: listings.data,
    columns,
    state: { sorting, columnFilters, globalFilter: search.trim() },
    onSortingChange: setSorting,
    globalFilterFn: searchFilter,
    // The search looks at the whole row once, not once per column.
    getColumnCanGlobalFilter: (column) => column.id === 'title',
    getRowId: (l) => l.id,
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const counts = useMemo(() => {
    const c = new Map<ListingStatus, number>();
    for (const l of listings.data) c.set(l.status, (c.get(l.status) ?? 0) + 1);
    return c;
  }, [listings.data]);
  const rows = table.getRowModel().rows;
  const total = listings.data.length;

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <div className="min-w-0 flex-1 basis-56">
          <label htmlFor="desk-search" className="field-label">
            Search your listings
          </label>
          <input
            id="desk-search"
            type="search"
            className="field-input"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="Title, category or status"
          />
        </div>
        <div className="basis-48">
          <label htmlFor="desk-status" className="field-label">
            Status
          </label>
          <select id="desk-status" className="field-input" value={status} onChange={(e) => setStatus(e.target.value as StatusFilter)}>
            <option value="active">All but archived</option>
            <option value="all">All</option>
            {LISTING_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]} ({counts.get(s) ?? 0})
              </option>
            ))}
          </select>
        </div>
      </div>
      <div aria-live="polite">{message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}</div>
      {listings.error && <FormMessage kind="bad">{listings.error.message}</FormMessage>}
      <p className="mb-2 text-sm text-ink-soft" role="status">
        <span className="num">{rows.length}</span> of <span className="num">{total}</span> listings shown
      </p>
      {/* Below the sm breakpoint each row stacks as a card with its column names beside the values; the
          explicit roles keep the table's semantics where the display change would drop them. */}
      <div className="table-scroll rounded-md border border-rule bg-white max-sm:px-3">
        <table className="data-table max-sm:block" role="table" aria-label="Your lab's listings">
          <thead className="max-sm:block" role="rowgroup">
            {table.getHeaderGroups().map((hg) => (
              <tr
                key={hg.id}
                role="row"
                className="max-sm:flex max-sm:flex-wrap max-sm:items-baseline max-sm:gap-x-3 max-sm:border-b max-sm:border-rule-strong max-sm:py-1.5"
              >
                <th className="hidden text-ink-soft max-sm:block max-sm:border-0 max-sm:p-0" aria-hidden="true">
                  Sort:
                </th>
                {hg.headers.map((h) => (
                  <th
                    key={h.id}
                    role="columnheader"
                    aria-sort={ariaSort(h.column.getIsSorted())}
                    className={`whitespace-nowrap max-sm:border-0 max-sm:p-0 ${h.column.getCanSort() ? '' : 'max-sm:hidden'}`}
                  >
                    {h.column.getCanSort() ? (
                      <button type="button" onClick={h.column.getToggleSortingHandler()} className="uppercase tracking-[0.04em]">
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true">
                          {h.column.getIsSorted() === 'asc' ? ' ↑' : h.column.getIsSorted() === 'desc' ? ' ↓' : ' ↕'}
                        </span>
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody className="max-sm:block" role="rowgroup">
            {rows.length === 0 && (
              <tr role="row" className="max-sm:block">
                <td colSpan={columns.length} role="cell" className="py-6 text-center text-ink-soft max-sm:block">
                  {total === 0 ? (
                    <>
                      No listings yet. <a href="/desk/listings/new">List your first part</a>.
                    </>
                  ) : (
                    'No listing matches the search and status filter.'
                  )}
                </td>
              </tr>
            )}
            {rows.map((row) => (
              <tr
                key={row.id}
                role="row"
                data-listing={row.original.title}
                className="max-sm:block max-sm:border-b max-sm:border-rule max-sm:py-2 max-sm:last:border-b-0"
              >
                {row.getVisibleCells().map((cell) => (
                  <td
                    key={cell.id}
                    role="cell"
                    data-label={String(cell.column.columnDef.header)}
                    className={cell.column.id === 'title' ? 'max-sm:block max-sm:border-0 max-sm:px-0 max-sm:py-1' : STACKED_CELL}
                  >
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** The seller desk: the lab's listings, sortable and searchable, with stock, duplicate and archive in each row. */
export default function SellerDesk(props: Props) {
  return (
    <QueryRoot>
      <Desk {...props} />
    </QueryRoot>
  );
}
