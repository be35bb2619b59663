import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '../../lib/api-client';
import { formatDate } from '../../lib/format';
import { MODE_LABELS } from '../../lib/search/goal-forms';
import { QueryRoot } from '../forms/QueryRoot';

export interface SavedSearchRow {
  id: string;
  name: string;
  mode: keyof typeof MODE_LABELS;
  url: string;
  active: boolean;
  hits: number;
  createdAt: string;
  lastNotifiedAt: string | null;
}

function Rows({ initial }: { initial: SavedSearchRow[] }) {
  const [rows, setRows] = useState(initial);
  const [error, setError] = useState<string | null>(null);
  const setActive = useMutation({
    mutationFn: ({ id, active }: { id: string; active: boolean }) =>
      api<{ savedSearch: SavedSearchRow }>(`/api/saved-searches/${id}`, { method: 'PATCH', body: { active } }),
    onSuccess: ({ savedSearch }) => setRows((rs) => rs.map((r) => (r.id === savedSearch.id ? savedSearch : r))),
    onError: (e) => setError(e.message),
  });
  const remove = useMutation({
    mutationFn: (id: string) => api(`/api/saved-searches/${id}`, { method: 'DELETE' }).then(() => id),
    onSuccess: (id) => setRows((rs) => rs.filter((r) => r.id !== id)),
    onError: (e) => setError(e.message),
  });
  if (rows.length === 0) {
    return (
      <p className="notice" role="status">
        No saved searches. On the <a href="/search">search page</a>, state your goal and choose “Save this search”: we e-mail you when a
        newly approved listing fits it.
      </p>
    );
  }
  return (
    <>
      {error && (
        <p className="notice notice-bad mb-3" role="alert">
          {error}
        </p>
      )}
      <div className="table-scroll">
        <table className="data-table" data-testid="saved-searches">
          <thead>
            <tr>
              <th scope="col">Search</th>
              <th scope="col">Fits found</th>
              <th scope="col">E-mails</th>
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id}>
                <td>
                  <a href={r.url}>{r.name}</a>
                  <div className="text-xs text-ink-faint">
                    {MODE_LABELS[r.mode]} · saved {formatDate(r.createdAt)}
                  </div>
                </td>
                <td className="num">{r.hits}</td>
                <td>
                  {r.active ? 'on, at most one a day' : 'stopped'}
                  {r.lastNotifiedAt && <div className="text-xs text-ink-faint">last {formatDate(r.lastNotifiedAt)}</div>}
                </td>
                <td className="text-right">
                  <button
                    type="button"
                    className="btn btn-quiet mb-1 py-1 text-sm"
                    onClick={() => setActive.mutate({ id: r.id, active: !r.active })}
                  >
                    {r.active ? 'Stop e-mails' : 'Resume e-mails'}
                  </button>{' '}
                  <button type="button" className="btn btn-quiet py-1 text-sm" onClick={() => remove.mutate(r.id)}>
                    Delete
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}

/** The buyer's saved searches, with their e-mails switched on or off and deletion. */
export default function SavedSearchList({ initial }: { initial: SavedSearchRow[] }) {
  return (
    <QueryRoot>
      <Rows initial={initial} />
    </QueryRoot>
  );
}
