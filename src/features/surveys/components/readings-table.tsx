import { useRef, useState } from 'react';
import { useQueries } from '@tanstack/react-query';
import { useVirtualizer } from '@tanstack/react-virtual';
import { ArrowDown, ArrowUp } from 'lucide-react';
import { READING_FLAG_LABELS, type Reading } from '@shared/schemas/readings';
import { READING_FLAGS, type ReadingFlag } from '@shared/core/types';
import { READINGS_PAGE, readingsPageQueryOptions, useReadingsPage, type ReadingsFilter } from '../api/get-readings';
import { useDebounced } from '../hooks/use-debounced';
import { formatClock, formatDay, zoneLabel } from '@shared/datetime';
import { useUnits } from '@/lib/units';
import { useNarrow } from '@/lib/use-narrow';
import { Badge, type Tone } from '@/components/ui/badge';
import { SelectField, TextField } from '@/components/ui/field';
import { EmptyState, ErrorState, Spinner } from '@/components/ui/states';
import { cx } from '@/components/ui/cx';

const FLAG_TONE: Record<ReadingFlag, Tone> = { ok: 'good', over_range: 'warn', under_range: 'warn', fault: 'bad', calibration_lapsed: 'unsure', low_confidence: 'unsure' };
const ROW_HEIGHT = 40;
/** A stacked row at phone width: the value and flag first, then time, point and probe. */
const STACKED_ROW_HEIGHT = 64;
const GRID = 'grid grid-cols-[11rem_7rem_6rem_6rem_8rem_7rem_9rem_4rem_4rem] items-center gap-2 px-3';

export function FlagBadge({ flag }: { flag: ReadingFlag }) {
  return <Badge tone={FLAG_TONE[flag]}>{READING_FLAG_LABELS[flag]}</Badge>;
}

type SortKey = ReadingsFilter['sort'];

/**
 * Every current reading of the survey, sortable and filterable on the server, in a virtualised
 * list: only the rows in view are in the page, and only their pages are fetched.
 */
export function ReadingsTable({ surveyId, timeZone }: { surveyId: number; timeZone: string }) {
  const units = useUnits();
  const [flag, setFlag] = useState<ReadingFlag | ''>('');
  const [pointText, setPointText] = useState('');
  const point = useDebounced(pointText.trim());
  const [sort, setSort] = useState<{ sort: SortKey; order: 'asc' | 'desc' }>({ sort: 'time', order: 'asc' });
  const filter: ReadingsFilter = { ...sort, ...(flag ? { flag } : {}), ...(point ? { point } : {}) };
  const first = useReadingsPage(surveyId, filter, 0);
  const total = first.data?.total ?? 0;
  const scroller = useRef<HTMLDivElement>(null);
  const narrow = useNarrow();
  const rowHeight = narrow ? STACKED_ROW_HEIGHT : ROW_HEIGHT;
  // eslint-disable-next-line react-hooks/incompatible-library -- the virtualiser returns fresh functions by design
  const virtual = useVirtualizer({ count: total, getScrollElement: () => scroller.current, estimateSize: () => rowHeight, overscan: 15 });
  const items = virtual.getVirtualItems();
  const pages = [...new Set(items.map((i) => Math.floor(i.index / READINGS_PAGE)))];
  const pageQueries = useQueries({ queries: pages.map((p) => readingsPageQueryOptions(surveyId, filter, p)) });
  const rowAt = (index: number): Reading | undefined => {
    const p = Math.floor(index / READINGS_PAGE);
    const data = p === 0 ? first.data : pageQueries[pages.indexOf(p)]?.data;
    return data?.items[index % READINGS_PAGE];
  };
  // Times in the site's zone, the zone named in the heading (shared/datetime, as on the chart).
  const firstTime = first.data?.items[0]?.timestamp;
  const zone = `${timeZone}${firstTime ? `, ${zoneLabel(firstTime, timeZone)}` : ''}`;
  const when = (iso: string) => `${formatDay(iso, timeZone)}, ${formatClock(iso, timeZone, { seconds: true })}`;

  const header = (key: SortKey | null, label: string, className?: string) => {
    if (!key) return <div role="columnheader" className={className}>{label}</div>;
    const active = sort.sort === key;
    return (
      <div role="columnheader" aria-sort={active ? (sort.order === 'asc' ? 'ascending' : 'descending') : 'none'} className={className}>
        <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-ink-900 focus-visible:underline"
          onClick={() => setSort({ sort: key, order: active && sort.order === 'asc' ? 'desc' : 'asc' })}>
          {label}{active && (sort.order === 'asc' ? <ArrowUp className="h-3 w-3" aria-hidden /> : <ArrowDown className="h-3 w-3" aria-hidden />)}
        </button>
      </div>
    );
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3 px-5 pt-4">
        <SelectField label="Flag" value={flag} onChange={(e) => setFlag(e.target.value as ReadingFlag | '')} className="w-48">
          <option value="">All flags</option>
          {READING_FLAGS.map((f) => <option key={f} value={f}>{READING_FLAG_LABELS[f]}</option>)}
        </SelectField>
        <TextField label="Point contains" value={pointText} onChange={(e) => setPointText(e.target.value)} placeholder="e.g. RR-" className="w-48" />
        <p className="pb-2 text-sm text-ink-600" role="status">{first.data ? `${total.toLocaleString('en-GB')} reading${total === 1 ? '' : 's'}` : ''}</p>
      </div>
      {first.isPending ? <Spinner label="Loading readings…" /> : first.isError ? <ErrorState error={first.error} onRetry={() => first.refetch()} /> : total === 0 ? (
        <EmptyState title={flag || point ? 'No reading matches these filters' : 'No readings yet'}>{flag || point ? 'Clear the filters to see every reading.' : 'Upload a meter log above.'}</EmptyState>
      ) : (
        <div role="table" aria-label="Readings" aria-rowcount={total} className={narrow ? undefined : 'scroll-x'}>
          <div className={narrow ? undefined : 'min-w-[68rem]'} role="presentation">
            <div role="rowgroup">
            {narrow ? (
              <div role="row" className="flex flex-wrap items-center gap-x-3 gap-y-1 border-y border-ink-100 bg-ink-50 px-3 py-2 text-xs font-medium uppercase tracking-wide text-ink-500">
                {header('lux', `Illuminance (${units.label})`)}{header('time', 'Time')}{header('point', 'Point')}{header('flag', 'Flag')}
                <span className="w-full normal-case tracking-normal">Times in {zone}</span>
              </div>
            ) : (
              <div role="row" className={cx(GRID, 'border-y border-ink-100 bg-ink-50 py-2 text-xs font-medium uppercase tracking-wide text-ink-500')}>
                {header('time', `Time (${zone})`)}{header('point', 'Point')}{header('probe', 'Probe')}{header(null, 'Role')}
                {header('lux', `Illuminance (${units.label})`, 'text-right')}{header(null, `U, k=2 (${units.label})`, 'text-right')}{header('flag', 'Flag')}{header(null, 'Gain', 'text-right')}{header(null, 'Samples', 'text-right')}
              </div>
            )}
            </div>
            <div ref={scroller} role="rowgroup" className="max-h-[32rem] overflow-y-auto" tabIndex={0} aria-label="Readings list, scroll to see more">
              <div role="presentation" style={{ height: virtual.getTotalSize(), position: 'relative' }}>
                {items.map((vi) => {
                  const r = rowAt(vi.index);
                  const value = r ? units.format(r.lux, { bound: r.luxBound }) : '';
                  const u = r && r.uLux !== null && r.luxBound === 'exact' ? `± ${units.format(r.uLux, { withUnit: false })}` : '–';
                  if (narrow) {
                    return (
                      <div key={vi.key} role="row" aria-rowindex={vi.index + 2} data-testid="reading-row" className="absolute left-0 right-0 flex flex-col justify-center gap-0.5 border-b border-ink-50 px-3 text-sm" style={{ height: STACKED_ROW_HEIGHT, transform: `translateY(${vi.start}px)` }}>
                        {r ? (
                          <>
                            <div className="flex items-center justify-between gap-2">
                              <span role="cell" className="num font-semibold text-ink-900" data-key-value>{value}<span className="ml-1 font-normal text-ink-500">{u === '–' ? '' : u}</span></span>
                              <span role="cell"><FlagBadge flag={r.flag} /></span>
                            </div>
                            <div className="flex min-w-0 gap-2 text-xs text-ink-600">
                              <span role="cell" className="num shrink-0">{when(r.timestamp)}</span>
                              <span role="cell" className="truncate font-medium text-ink-800" title={r.point}>{r.point}</span>
                              <span role="cell" className="truncate">{r.probe}{r.gainCode === null ? '' : ` · gain ${r.gainCode}`}</span>
                            </div>
                          </>
                        ) : <div role="cell" className="text-ink-400">Loading…</div>}
                      </div>
                    );
                  }
                  return (
                    <div key={vi.key} role="row" aria-rowindex={vi.index + 2} data-testid="reading-row" className={cx(GRID, 'absolute left-0 right-0 border-b border-ink-50 text-sm')} style={{ height: ROW_HEIGHT, transform: `translateY(${vi.start}px)` }}>
                      {r ? (
                        <>
                          <div role="cell" className="num text-ink-700">{when(r.timestamp)}</div>
                          <div role="cell" className="truncate font-medium text-ink-900" title={r.point}>{r.point}</div>
                          <div role="cell" className="text-ink-600">{r.probe}</div>
                          <div role="cell" className="text-ink-600">{r.role === 'reference' ? 'Reference' : 'Task'}</div>
                          <div role="cell" className="num text-right" data-key-value>{units.format(r.lux, { withUnit: false, bound: r.luxBound })}</div>
                          <div role="cell" className="num text-right text-ink-600">{u}</div>
                          <div role="cell"><FlagBadge flag={r.flag} /></div>
                          <div role="cell" className="num text-right">{r.gainCode ?? '–'}</div>
                          <div role="cell" className="num text-right" title={r.chosenSample === null ? 'No usable sample' : `Sample ${r.chosenSample + 1} of ${r.samples} chosen`}>{r.samples}</div>
                        </>
                      ) : <div role="cell" className="col-span-9 text-ink-400">Loading…</div>}
                    </div>
                  );
                })}
              </div>
            </div>
          </div>
        </div>
      )}
    </div>
  );
}
