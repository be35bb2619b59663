import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useDeferredValue, useMemo, useState } from 'react';
import { api, type ApiError } from '../../lib/api-client';
import { ROLE_LABELS, ROLE_NAMES, type RoleName } from '../../lib/roles';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';

interface UserRow {
  id: string;
  email: string;
  name: string;
  verified: boolean;
  roles: RoleName[];
}

const col = createColumnHelper<UserRow>();
/** The table needs the same array while loading: a fresh [] on each render keeps it recomputing and can hang the page. */
const NO_USERS: UserRow[] = [];

function RoleToggle({ user, role }: { user: UserRow; role: RoleName }) {
  const qc = useQueryClient();
  const has = user.roles.includes(role);
  const m = useMutation<unknown, ApiError>({
    mutationFn: () =>
      has
        ? api(`/api/admin/users/${user.id}/roles/${role}`, { method: 'DELETE' })
        : api(`/api/admin/users/${user.id}/roles`, { body: { role } }),
    onSuccess: () =>
      qc.setQueriesData<{ users: UserRow[] }>(
        { queryKey: ['admin-users'] },
        (old) =>
          old && {
            users: old.users.map((u) =>
              u.id === user.id ? { ...u, roles: has ? u.roles.filter((r) => r !== role) : [...u.roles, role].sort() } : u,
            ),
          },
      ),
  });
  // Shown as changed while the request runs; the server's answer settles it.
  const checked = m.isPending ? !has : has;
  return (
    <span className="inline-flex flex-col">
      <label className="inline-flex items-center gap-1.5 text-sm">
        <input
          type="checkbox"
          checked={checked}
          disabled={m.isPending}
          onChange={() => m.mutate()}
          aria-label={`${ROLE_LABELS[role]} role for ${user.email}`}
        />
        {ROLE_LABELS[role]}
      </label>
      {m.error && (
        <span className="field-error" role="alert">
          {m.error.message}
        </span>
      )}
    </span>
  );
}

function Roles() {
  const [q, setQ] = useState('');
  const deferred = useDeferredValue(q);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'email', desc: false }]);
  const users = useQuery<{ users: UserRow[] }, ApiError>({
    queryKey: ['admin-users', deferred],
    queryFn: () => api(`/api/admin/users?q=${encodeURIComponent(deferred)}`),
  });
  const columns = useMemo(
    () => [
      col.accessor('email', { header: 'E-mail' }),
      col.accessor('name', { header: 'Name' }),
      col.accessor('verified', { header: 'Confirmed', cell: (c) => (c.getValue() ? 'yes' : 'not yet') }),
      col.display({
        id: 'roles',
        header: 'Roles',
        cell: (c) => (
          <span className="flex flex-wrap gap-x-3 gap-y-1">
            {ROLE_NAMES.map((r) => (
              <RoleToggle key={r} user={c.row.original} role={r} />
            ))}
          </span>
        ),
      }),
    ],
    [],
  );
  const table = useReactTable({
    data: users.data?.users ?? NO_USERS,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  return (
    <div>
      <label htmlFor="user-filter" className="field-label">
        Find people
      </label>
      <input
        id="user-filter"
        className="field-input mb-4 max-w-sm"
        type="search"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        placeholder="E-mail or name"
      />
      {users.error && <FormMessage kind="bad">{users.error.message}</FormMessage>}
      <div className="table-scroll">
        <table className="data-table">
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th
                    key={h.id}
                    aria-sort={
                      h.column.getIsSorted() === 'asc' ? 'ascending' : h.column.getIsSorted() === 'desc' ? 'descending' : undefined
                    }
                  >
                    {h.column.getCanSort() ? (
                      <button type="button" onClick={h.column.getToggleSortingHandler()} className="uppercase">
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        {h.column.getIsSorted() === 'asc' ? ' ↑' : h.column.getIsSorted() === 'desc' ? ' ↓' : ''}
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {users.isPending && (
              <tr>
                <td colSpan={4}>Loading…</td>
              </tr>
            )}
            {users.data?.users.length === 0 && (
              <tr>
                <td colSpan={4}>Nobody matches “{deferred}”.</td>
              </tr>
            )}
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} data-user={row.original.email}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

export default function UserRoles() {
  return (
    <QueryRoot>
      <Roles />
    </QueryRoot>
  );
}
