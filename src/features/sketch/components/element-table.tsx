import { useEffect, useMemo, useRef, useState } from 'react';
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import type { ElementCheck } from '@shared/engine/types';
import type { SpoolElement } from '@shared/model/spool';
import { inputClass } from '@/components/ui/field';
import { CheckBadge } from '@/components/ui/status-badge';
import { formatNumber, formatPercent } from '@/lib/format';
import { cn } from '@/lib/cn';
import { caseLabel } from './check-report';
import { useDisplayUnits } from './display-units';

interface Row {
  readonly index: number;
  readonly el: SpoolElement;
  readonly check: ElementCheck | undefined;
  readonly status: string;
}

/** Lists longer than this render only the rows in view (a spool may have 20,000 elements). */
const WINDOW_FROM = 300;
const ROW_HEIGHT = 24;
const OVERSCAN = 10;

const STATUS_ORDER: Record<string, number> = {
  pass: 0,
  marginal: 1,
  review: 2,
  fail: 3,
  invalid: 4,
};

export interface ElementTableProps {
  readonly elements: readonly SpoolElement[];
  readonly checks: readonly ElementCheck[];
  readonly selectedId: string | null;
  readonly onSelect: (id: string) => void;
  /** Open review comments per element: a marker beside the element id. */
  readonly markers?: ReadonlyMap<string, number> | undefined;
  /** A marker was clicked (after the row is selected): open the element's thread. */
  readonly onMarker?: ((id: string) => void) | undefined;
}

/** Every element of the spool with its check; follows and drives the canvas selection. */
export function ElementTable({
  elements,
  checks,
  selectedId,
  onSelect,
  markers,
  onMarker,
}: ElementTableProps) {
  const units = useDisplayUnits();
  const [sorting, setSorting] = useState<SortingState>([]);
  const [statusFilter, setStatusFilter] = useState('');
  const byId = useMemo(() => new Map(checks.map((c) => [c.id, c])), [checks]);
  const data = useMemo<Row[]>(
    () =>
      elements.map((el, index) => ({
        index,
        el,
        check: byId.get(el.id),
        status: byId.get(el.id)?.status ?? 'invalid',
      })),
    [elements, byId],
  );
  const columns = useMemo<ColumnDef<Row>[]>(
    () => [
      { id: 'index', header: '#', accessorFn: (r) => r.index + 1 },
      {
        id: 'id',
        header: 'Element',
        accessorFn: (r) => r.el.id,
        cell: ({ row }) => {
          const id = row.original.el.id;
          const n = markers?.get(id) ?? 0;
          return (
            <span className="inline-flex items-center gap-1">
              <code>{id}</code>
              {n > 0 ? (
                <button
                  type="button"
                  data-testid={`comment-marker-${id}`}
                  aria-label={`${n} open comment${n === 1 ? '' : 's'} on ${id}`}
                  className="rounded-full bg-violet-700 px-1.5 text-[10px] leading-4 font-semibold text-white hover:bg-violet-800"
                  onClick={(e) => {
                    e.stopPropagation();
                    onSelect(id);
                    onMarker?.(id);
                  }}
                >
                  ✎{n}
                </button>
              ) : null}
            </span>
          );
        },
      },
      { id: 'kind', header: 'Kind', accessorFn: (r) => r.el.kind },
      { id: 'nps', header: 'NPS', accessorFn: (r) => String(r.el.nps ?? '—') },
      { id: 'schedule', header: 'Sch.', accessorFn: (r) => String(r.el.schedule ?? '—') },
      {
        id: 'size',
        header: `Length / angle`,
        accessorFn: (r) => (r.el.kind === 'straight' ? r.el.length : r.el.angle),
        cell: ({ row }) => {
          const el = row.original.el;
          return el.kind === 'straight'
            ? `${formatNumber(units.toDisplay(el.length, 'length'))} ${units.label('length')}`
            : `${formatNumber(el.angle)}°`;
        },
      },
      {
        id: 'status',
        header: 'Check',
        accessorFn: (r) => r.status,
        sortingFn: (a, b) =>
          (STATUS_ORDER[a.original.status] ?? 9) - (STATUS_ORDER[b.original.status] ?? 9),
        filterFn: (row, _id, value) => value === '' || row.original.status === value,
        cell: ({ row }) => <CheckBadge status={row.original.status} />,
      },
      {
        id: 'margin',
        header: 'Margin',
        accessorFn: (r) => r.check?.margin ?? Number.NEGATIVE_INFINITY,
        cell: ({ row }) => formatPercent(row.original.check?.margin),
      },
      { id: 'governing', header: 'Governs', accessorFn: (r) => caseLabel(r.check?.governing) },
    ],
    [units, markers, onMarker, onSelect],
  );
  const columnFilters = useMemo(
    () => (statusFilter ? [{ id: 'status', value: statusFilter }] : []),
    [statusFilter],
  );
  // The table instance is used only in this component's own render.
  const table = useReactTable({
    data,
    columns,
    state: { sorting, columnFilters },
    // Rows are not paginated; an automatic page reset on every data change would re-render in a loop.
    autoResetPageIndex: false,
    autoResetExpanded: false,
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getRowId: (r) => r.el.id,
  });

  const bodyRef = useRef<HTMLTableSectionElement>(null);
  const scrollRef = useRef<HTMLDivElement>(null);
  const [viewport, setViewport] = useState({ top: 0, height: 400 });
  const rows = table.getRowModel().rows;
  const windowed = rows.length > WINDOW_FROM;
  const onScroll = () => {
    const el = scrollRef.current;
    if (el) setViewport({ top: el.scrollTop, height: el.clientHeight });
  };
  useEffect(() => {
    if (!selectedId) return;
    if (!windowed) {
      const trs = bodyRef.current?.querySelectorAll<HTMLElement>('tr[data-element-id]') ?? [];
      const tr = Array.from(trs).find((r) => r.dataset.elementId === selectedId);
      tr?.scrollIntoView?.({ block: 'nearest' });
      return;
    }
    // Long lists render only the rows in view: scroll by arithmetic (rows have a fixed height).
    const el = scrollRef.current;
    const index = rows.findIndex((r) => r.original.el.id === selectedId);
    if (!el || index < 0) return;
    const top = index * ROW_HEIGHT;
    if (top < el.scrollTop) el.scrollTop = top;
    else if (top + 2 * ROW_HEIGHT > el.scrollTop + el.clientHeight)
      el.scrollTop = top - el.clientHeight + 2 * ROW_HEIGHT;
    onScroll();
    // eslint-disable-next-line react-hooks/exhaustive-deps -- follow the selection only, not every re-sort
  }, [selectedId]);
  const first = windowed ? Math.max(0, Math.floor(viewport.top / ROW_HEIGHT) - OVERSCAN) : 0;
  const last = windowed
    ? Math.min(rows.length, first + Math.ceil(viewport.height / ROW_HEIGHT) + 2 * OVERSCAN)
    : rows.length;
  const visibleRows = windowed ? rows.slice(first, last) : rows;

  const shown = rows.length;
  return (
    <section aria-label="Element list" className="flex h-full min-h-0 flex-col">
      <div className="flex items-center gap-2 border-b border-steel-200 px-2 py-1">
        <h3 className="text-xs font-semibold uppercase tracking-wide text-steel-600">
          Element list
        </h3>
        <span className="text-xs text-steel-400" data-testid="element-count">
          {shown} of {elements.length}
        </span>
        <select
          aria-label="Filter elements by check"
          className={cn(inputClass, 'ml-auto h-7 w-36 text-xs')}
          value={statusFilter}
          onChange={(e) => setStatusFilter(e.target.value)}
        >
          <option value="">every check</option>
          {['pass', 'marginal', 'fail', 'review', 'invalid'].map((s) => (
            <option key={s} value={s}>
              {s}
            </option>
          ))}
        </select>
      </div>
      <div
        ref={scrollRef}
        onScroll={windowed ? onScroll : undefined}
        className="min-h-0 flex-1 overflow-auto"
      >
        <table className="w-full text-xs" data-testid="element-table">
          <thead className="sticky top-0 bg-steel-100 text-left text-steel-600">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      className="px-2 py-1 font-medium"
                      aria-sort={
                        sorted ? (sorted === 'asc' ? 'ascending' : 'descending') : undefined
                      }
                    >
                      <button
                        type="button"
                        className="flex items-center gap-0.5 hover:text-steel-900"
                        onClick={h.column.getToggleSortingHandler()}
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden className="text-copper-500">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody ref={bodyRef}>
            {first > 0 ? <tr aria-hidden style={{ height: first * ROW_HEIGHT }} /> : null}
            {visibleRows.map((row) => {
              const selected = row.original.el.id === selectedId;
              return (
                <tr
                  key={row.id}
                  data-element-id={row.original.el.id}
                  aria-selected={selected}
                  onClick={() => onSelect(row.original.el.id)}
                  className={cn(
                    'h-6 cursor-pointer border-t border-steel-100 hover:bg-steel-50',
                    selected && 'bg-copper-400/20 hover:bg-copper-400/25',
                  )}
                >
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-2 py-0 whitespace-nowrap tabular-nums">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
            {last < rows.length ? (
              <tr aria-hidden style={{ height: (rows.length - last) * ROW_HEIGHT }} />
            ) : null}
          </tbody>
        </table>
        {elements.length === 0 ? (
          <p className="p-3 text-center text-xs text-steel-500">
            No elements yet: start a run and draw legs.
          </p>
        ) : null}
      </div>
    </section>
  );
}
