import { useEffect, useMemo, useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { CheckBadge, LifecycleBadge } from '@/components/ui/status-badge';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { useCan, useRole } from '@/features/auth/use-can';
import { formatDateTime } from '@/lib/format';
import { cn } from '@/lib/cn';
import { WaitingList } from '@/features/review/components/waiting-list';
import { createBlankDocument, useCreateSpool } from '../api/create-spool';
import { useSpools } from '../api/get-spools';
import { SPOOL_STATUSES, type SpoolStatus, type SpoolSummary } from '../api/spool-schemas';

const PAGE_SIZE = 25;
const SORTABLE = new Set(['name', 'line', 'status', 'revision', 'updatedAt']);

/** The spool's name, linking to the sketch — or, for a fabricator, a released spool's fabrication sheet. */
function SpoolNameLink({ spool }: { spool: SpoolSummary }) {
  const role = useRole();
  const toSheet = role === 'fabricator' && spool.status === 'released';
  return (
    <Link
      to={toSheet ? `/spools/${spool.id}/fabrication` : `/spools/${spool.id}`}
      title={toSheet ? 'Open the fabrication sheet' : undefined}
      className="font-medium text-steel-900 underline-offset-2 hover:text-copper-600 hover:underline"
    >
      {spool.name || '(unnamed)'}
    </Link>
  );
}

const columns: ColumnDef<SpoolSummary>[] = [
  {
    id: 'name',
    header: 'Spool',
    // Sorting happens on the server; the accessors only make the columns sortable.
    accessorFn: (r) => r.name ?? '',
    cell: ({ row }) => <SpoolNameLink spool={row.original} />,
  },
  {
    id: 'line',
    header: 'Line',
    accessorFn: (r) => r.line ?? '',
    cell: ({ row }) => row.original.line || <span className="text-steel-400">—</span>,
  },
  {
    id: 'status',
    header: 'State',
    accessorFn: (r) => r.status,
    cell: ({ row }) => <LifecycleBadge status={row.original.status} />,
  },
  {
    id: 'revision',
    header: 'Rev.',
    accessorFn: (r) => r.revision,
    cell: ({ row }) => <span className="tabular-nums">{row.original.revision}</span>,
  },
  {
    id: 'worst',
    header: 'Weakest element',
    enableSorting: false,
    cell: ({ row }) =>
      row.original.worst ? (
        <span className="flex items-center gap-2">
          <CheckBadge status={row.original.worst.status} />
          <Link
            to={`/spools/${row.original.id}?element=${encodeURIComponent(row.original.worst.elementId)}`}
            className="font-mono text-xs text-steel-500 hover:text-copper-600 hover:underline"
            title="Open the spool with this element selected"
          >
            {row.original.worst.elementId}
          </Link>
        </span>
      ) : (
        <span className="text-xs text-steel-400">no elements</span>
      ),
  },
  {
    id: 'updatedAt',
    header: 'Last saved',
    accessorFn: (r) => r.updatedAt,
    cell: ({ row }) => (
      <span className="tabular-nums">{formatDateTime(row.original.updatedAt)}</span>
    ),
  },
];

function parseSort(sort: string | null): SortingState {
  const s = sort ?? '-updatedAt';
  const desc = s.startsWith('-');
  const id = desc ? s.slice(1) : s;
  return SORTABLE.has(id) ? [{ id, desc }] : [{ id: 'updatedAt', desc: true }];
}

/** The spool register: every spool of the team, searchable, filterable by state, sortable. */
export function SpoolListPage() {
  const [params, setParams] = useSearchParams();
  const search = params.get('q') ?? '';
  const statusParam = params.get('status');
  const status = (SPOOL_STATUSES as readonly string[]).includes(statusParam ?? '')
    ? (statusParam as SpoolStatus)
    : undefined;
  const page = Math.max(1, Number(params.get('page') ?? '1') || 1);
  const sorting = parseSort(params.get('sort'));
  const sortParam = sorting[0] ? `${sorting[0].desc ? '-' : ''}${sorting[0].id}` : '-updatedAt';

  useEffect(() => {
    document.title = 'Spool register · Spoolwright';
  }, []);
  const [searchDraft, setSearchDraft] = useState(search);
  useEffect(() => {
    const t = setTimeout(() => {
      if (searchDraft === search) return;
      setParams(
        (p) => {
          const n = new URLSearchParams(p);
          if (searchDraft) n.set('q', searchDraft);
          else n.delete('q');
          n.delete('page');
          return n;
        },
        { replace: true },
      );
    }, 250);
    return () => clearTimeout(t);
  }, [searchDraft, search, setParams]);

  const query = useSpools({
    search: search || undefined,
    status,
    sort: sortParam,
    page,
    pageSize: PAGE_SIZE,
  });
  const items = useMemo(() => query.data?.items ?? [], [query.data]);
  const total = query.data?.total ?? 0;
  const pageCount = Math.max(1, Math.ceil(total / PAGE_SIZE));

  const update = (patch: Record<string, string | undefined>) =>
    setParams((p) => {
      const n = new URLSearchParams(p);
      for (const [k, v] of Object.entries(patch)) {
        if (v === undefined || v === '') n.delete(k);
        else n.set(k, v);
      }
      return n;
    });

  // The table instance is used only in this component's own render, never passed to memoised children.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: items,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    pageCount,
    state: { sorting, pagination: { pageIndex: page - 1, pageSize: PAGE_SIZE } },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const s = next[0];
      update({ sort: s ? `${s.desc ? '-' : ''}${s.id}` : undefined, page: undefined });
    },
    enableSortingRemoval: false,
  });

  const canEdit = useCan('spool:edit');
  const create = useCreateSpool();
  const navigate = useNavigate();
  const createNew = () => {
    const name = `Spool ${new Date().toISOString().slice(0, 16).replace('T', ' ')}`;
    create.mutate(createBlankDocument(name), {
      onSuccess: (spool) => void navigate(`/spools/${spool.id}`),
    });
  };

  return (
    <main className="mx-auto flex h-full max-w-6xl flex-col gap-4 overflow-auto p-6 font-sans">
      <WaitingList />
      <div className="flex items-end gap-4">
        <div>
          <h1 className="text-2xl font-semibold text-steel-800">Spool register</h1>
          <p className="text-sm text-steel-500">
            {query.data ? `${total} spool${total === 1 ? '' : 's'}` : ' '}
          </p>
        </div>
        <div className="ml-auto flex items-end gap-2">
          <label className="flex flex-col text-xs text-steel-600">
            Find
            <input
              type="search"
              aria-label="Find spools"
              placeholder="name or line…"
              className={cn(inputClass, 'w-56')}
              value={searchDraft}
              onChange={(e) => setSearchDraft(e.target.value)}
            />
          </label>
          <label className="flex flex-col text-xs text-steel-600">
            State
            <select
              aria-label="Filter by state"
              className={cn(inputClass, 'w-40')}
              value={status ?? ''}
              onChange={(e) => update({ status: e.target.value || undefined, page: undefined })}
            >
              <option value="">all states</option>
              {SPOOL_STATUSES.map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </select>
          </label>
          {canEdit ? (
            <Button variant="primary" onClick={createNew} disabled={create.isPending}>
              + New spool
            </Button>
          ) : null}
        </div>
      </div>
      {create.isError ? <ErrorLine error={create.error} /> : null}
      {query.isError ? <ErrorLine error={query.error} /> : null}
      <div className="overflow-hidden rounded-lg border border-steel-200 bg-white">
        <table className="w-full text-sm" data-testid="spool-table">
          <thead className="bg-steel-100 text-left text-xs uppercase tracking-wide text-steel-600">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  const sortable = h.column.getCanSort() && SORTABLE.has(h.column.id);
                  return (
                    <th
                      key={h.id}
                      className="px-3 py-2 font-medium"
                      aria-sort={
                        sorted ? (sorted === 'asc' ? 'ascending' : 'descending') : undefined
                      }
                    >
                      {sortable ? (
                        <button
                          type="button"
                          className="flex items-center gap-1 uppercase hover:text-steel-900"
                          onClick={h.column.getToggleSortingHandler()}
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-copper-500">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}
                          </span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                className="border-t border-steel-100 hover:bg-steel-50"
                data-spool-id={row.original.id}
              >
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {query.isPending ? <LoadingLine /> : null}
        {query.data && items.length === 0 ? (
          <p className="p-6 text-center text-sm text-steel-500">No spools match.</p>
        ) : null}
      </div>
      <div className="flex items-center justify-end gap-2 text-sm text-steel-600">
        <Button size="sm" disabled={page <= 1} onClick={() => update({ page: String(page - 1) })}>
          ‹ Previous
        </Button>
        <span className="tabular-nums">
          page {page} of {pageCount}
        </span>
        <Button
          size="sm"
          disabled={page >= pageCount}
          onClick={() => update({ page: String(page + 1) })}
        >
          Next ›
        </Button>
      </div>
    </main>
  );
}
