import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import {
  createColumnHelper, flexRender, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown } from 'lucide-react';
import { PROBE_KIND_LABELS, PROBE_STATUS_LABELS, type DashboardRow } from '@shared/schemas/probes';
import { cx } from '@/components/ui/cx';
import { EmptyState } from '@/components/ui/states';
import { CalibrationStateBadge } from './calibration-state-badge';
import { formatDueDate } from './format';
import { paths } from '@shared/paths';

export type DashboardFilter = 'all' | 'due30' | 'overdue' | 'no_set';

const FILTERS: { key: DashboardFilter; label: string; test: (r: DashboardRow, dueSoonDays: number) => boolean }[] = [
  { key: 'all', label: 'All probes', test: () => true },
  { key: 'due30', label: 'Due in 30 days', test: (r, d) => r.calibrationState === 'due_soon' && (r.daysUntilDue ?? Infinity) <= d },
  { key: 'overdue', label: 'Overdue', test: (r) => r.calibrationState === 'overdue' },
  { key: 'no_set', label: 'No approved set', test: (r) => r.calibrationState === 'no_approved_set' },
];

const col = createColumnHelper<DashboardRow>();

function daysText(r: DashboardRow) {
  if (r.daysUntilDue === null) return '–';
  if (r.daysUntilDue < 0) return `${-r.daysUntilDue} days overdue`;
  if (r.daysUntilDue === 0) return 'due today';
  return `in ${r.daysUntilDue} days`;
}

/** At phone width (stacked rows): the probe first, then its state, due date and time left, then the rest, labelled. */
const STACK_KEY = new Set(['calibrationState', 'dueDate', 'daysUntilDue']);
const stackRole = (id: string, header: string) => (id === 'serial' ? { 'data-lead': '' } : STACK_KEY.has(id) ? { 'data-key': '', 'data-label': header } : { 'data-label': header });

/** Every probe with its due date; sortable columns, state filters and a text search (TanStack Table). */
export function DashboardTable({ rows, dueSoonDays, showRetired }: { rows: DashboardRow[]; dueSoonDays: number; showRetired: boolean }) {
  const [filter, setFilter] = useState<DashboardFilter>('all');
  const [search, setSearch] = useState('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'daysUntilDue', desc: false }]);
  const counts = useMemo(() => Object.fromEntries(FILTERS.map((f) => [f.key, rows.filter((r) => f.test(r, dueSoonDays)).length])), [rows, dueSoonDays]);
  const data = useMemo(() => {
    const f = FILTERS.find((x) => x.key === filter)!;
    return rows.filter((r) => f.test(r, dueSoonDays) && (showRetired || r.status !== 'retired'));
  }, [rows, filter, dueSoonDays, showRetired]);

  const columns = useMemo(() => [
    col.accessor('serial', {
      header: 'Probe',
      cell: (c) => (
        <div>
          <Link to={paths.probe.to(c.row.original.probeId)} className="font-semibold text-ink-900 underline-offset-2 hover:underline">{c.getValue()}</Link>
          <div className="text-xs text-ink-500">{c.row.original.description}</div>
        </div>
      ),
    }),
    col.accessor('kind', { header: 'Kind', cell: (c) => PROBE_KIND_LABELS[c.getValue()] }),
    col.accessor('status', { header: 'Status', cell: (c) => PROBE_STATUS_LABELS[c.getValue()] }),
    col.accessor('calibrationState', { header: 'Calibration', cell: (c) => <CalibrationStateBadge state={c.getValue()} /> }),
    col.accessor('dueDate', { header: 'Due date', cell: (c) => <span className="num">{formatDueDate(c.getValue())}</span>, sortingFn: 'datetime', sortUndefined: 'last' }),
    col.accessor('daysUntilDue', {
      header: 'Time left',
      cell: (c) => <span className={cx('num', (c.getValue() ?? 1) < 0 && 'font-semibold text-short-700')}>{daysText(c.row.original)}</span>,
      // Probes without a due date sort after every dated one.
      sortingFn: (a, b) => (a.original.daysUntilDue ?? Infinity) - (b.original.daysUntilDue ?? Infinity),
    }),
    col.accessor('currentVersion', { header: 'Version', cell: (c) => (c.getValue() ? `v${c.getValue()}` : '–') }),
    col.accessor('certificateNumber', { header: 'Certificate', cell: (c) => c.getValue() ?? '–' }),
    col.accessor('draftCount', { header: 'Drafts', cell: (c) => (c.getValue() ? `${c.getValue()} awaiting approval` : '–') }),
  ], []);

  const table = useReactTable({
    data, columns, state: { sorting, globalFilter: search }, onSortingChange: setSorting, onGlobalFilterChange: setSearch,
    getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel(), getFilteredRowModel: getFilteredRowModel(),
    globalFilterFn: (row, _id, value: string) => {
      const q = value.trim().toLowerCase();
      return !q || [row.original.serial, row.original.description, row.original.certificateNumber ?? ''].some((s) => s.toLowerCase().includes(q));
    },
  });

  return (
    <div>
      <div className="flex flex-wrap items-center gap-3 border-b border-ink-100 px-5 py-3">
        <div role="group" aria-label="Show" className="flex flex-wrap gap-1.5">
          {FILTERS.map((f) => (
            <button key={f.key} type="button" aria-pressed={filter === f.key} onClick={() => setFilter(f.key)}
              className={cx('rounded-full px-3 py-1 text-sm ring-1 ring-inset', filter === f.key ? 'bg-ink-900 text-white ring-ink-900' : 'bg-white text-ink-700 ring-ink-200 hover:bg-ink-50')}>
              {f.label} <span className="num opacity-70">({counts[f.key]})</span>
            </button>
          ))}
        </div>
        <label className="ml-auto flex items-center gap-2 text-sm text-ink-700">
          <span>Search</span>
          <input type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Serial, description, certificate"
            className="w-full max-w-56 rounded-lg border-0 px-3 py-1.5 text-sm ring-1 ring-inset ring-ink-200 focus:ring-2 focus:ring-lamp-500" />
        </label>
      </div>
      {table.getRowModel().rows.length === 0 ? (
        <EmptyState title="No probe matches">Choose another filter or clear the search.</EmptyState>
      ) : (
        <div className="scroll-x">
          <table className="stack-table min-w-full text-sm" aria-label="Calibration due dates">
            <thead className="bg-ink-50 text-left text-xs font-semibold uppercase tracking-wide text-ink-600">
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => {
                    const sorted = h.column.getIsSorted();
                    const Icon = sorted === 'asc' ? ArrowUp : sorted === 'desc' ? ArrowDown : ArrowUpDown;
                    return (
                      <th key={h.id} scope="col" className="px-4 py-2" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}>
                        <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 uppercase hover:text-ink-900">
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <Icon className="h-3.5 w-3.5" aria-hidden />
                        </button>
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody className="divide-y divide-ink-100">
              {table.getRowModel().rows.map((r) => (
                <tr key={r.id} className="align-top">
                  {r.getVisibleCells().map((c) => <td key={c.id} className="px-4 py-2.5" {...stackRole(c.column.id, String(c.column.columnDef.header))}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
