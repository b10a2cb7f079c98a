import type { MapReading } from '@shared/schemas/plans';
import { formatDateTime } from '@shared/datetime';

const FLAG_TEXT: Record<MapReading['flag'], string> = {
  ok: 'No flag',
  over_range: 'Over range: the probe saturated at every gain',
  under_range: 'Under range: below the probe\'s usable signal',
  fault: 'Fault: no value',
  calibration_lapsed: 'Calibration lapsed at the time of reading',
  low_confidence: 'Low confidence: wide uncertainty',
};

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

type Format = (lux: number | null | undefined, opts?: { withUnit?: boolean; bound?: 'exact' | 'lower' | 'upper' }) => string;

/** Popup and tooltip content for one reading: label, E ± U, time (in the site's zone, labelled), probe, gain code, flags. */
export function readingDetailsHtml(r: MapReading, format: Format, extra?: { zoneName?: string | null; deltaText?: string | null; timeZone?: string }): string {
  const value = r.lux === null ? 'No value' : `${format(r.lux, { bound: r.luxBound })}${r.uLux !== null && r.luxBound === 'exact' ? ` ± ${format(r.uLux)}` : ''}`;
  const rows: [string, string][] = [
    ['Illuminance', value],
    ...(extra?.deltaText ? [['Change', extra.deltaText] as [string, string]] : []),
    ['Time', formatDateTime(r.timestamp, extra?.timeZone, { seconds: true })],
    ['Probe', r.probe],
    ['Gain code', r.gainCode === null ? '–' : String(r.gainCode)],
    ['Flags', FLAG_TEXT[r.flag]],
    ...(r.role === 'reference' ? [['Role', 'Outdoor daylight reference'] as [string, string]] : []),
    ...(extra?.zoneName ? [['Zone', `${extra.zoneName}${r.inWallBand ? ' (wall band: left out of its statistics)' : ''}`] as [string, string]] : []),
  ];
  return `<div class="text-xs leading-5"><div class="mb-1 text-sm font-semibold">Point ${escapeHtml(r.point)}</div><dl class="grid grid-cols-[auto_1fr] gap-x-3">${rows
    .map(([k, v]) => `<dt class="text-ink-500">${escapeHtml(k)}</dt><dd class="font-medium">${escapeHtml(v)}</dd>`).join('')}</dl><div class="mt-1 text-[10px] text-ink-500">U is the expanded uncertainty (k = 2).</div></div>`;
}
