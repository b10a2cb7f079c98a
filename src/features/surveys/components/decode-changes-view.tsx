import { READING_FLAG_LABELS } from '@shared/schemas/readings';
import type { DecodeChanges, DecodedValue } from '@shared/schemas/readings';
import { formatDateTime } from '@shared/datetime';
import { useUnits } from '@/lib/units';
import { useNarrow } from '@/lib/use-narrow';
import { Badge } from '@/components/ui/badge';
import { EmptyState } from '@/components/ui/states';

function Value({ v }: { v: DecodedValue }) {
  const { format } = useUnits();
  return (
    <span className="num">
      {v.lux === null ? 'no value' : format(v.lux, { bound: v.luxBound })}
      {v.uLux !== null && v.luxBound === 'exact' && v.lux !== null ? <span className="text-ink-500"> ± {format(v.uLux, { withUnit: false })}</span> : null}
      <span className="block text-xs text-ink-500">{READING_FLAG_LABELS[v.flag]}{v.coefficientSetVersion !== null ? ` · set v${v.coefficientSetVersion}` : ''}</span>
    </span>
  );
}

/**
 * What the latest re-decode changed, reading by reading, before and after: read-only, so
 * calibration staff see the effect of their correction without the survey's other pages.
 */
export function DecodeChangesView({ d }: { d: DecodeChanges }) {
  const narrow = useNarrow();
  const { label } = useUnits();
  const when = (iso: string) => formatDateTime(iso, d.siteTimeZone, { seconds: true });
  return (
    <div className="space-y-4">
      <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="text-ink-500">Before</dt>
        <dd>{d.before ? `Decode ${d.before.decodeId}, ${when(d.before.createdAt)}` : 'No earlier decode: this survey has not been re-decoded.'}</dd>
        <dt className="text-ink-500">After</dt>
        <dd>{d.after ? `Decode ${d.after.decodeId}, ${when(d.after.createdAt)}${d.after.createdByName ? ` by ${d.after.createdByName}` : ''}` : 'No readings yet.'}</dd>
        <dt className="text-ink-500">Now</dt>
        <dd>{d.decodedWithCurrentSets ? <Badge tone="good">Decoded with the sets in force now</Badge> : <Badge tone="warn">A newer approved set applies: re-decoding would change readings</Badge>}</dd>
      </dl>
      {d.before && (
        <p className="text-sm text-ink-700" role="status">
          {d.changedTotal.toLocaleString('en-GB')} of {d.compared.toLocaleString('en-GB')} readings changed{d.changes.length < d.changedTotal ? ` (the first ${d.changes.length.toLocaleString('en-GB')} are listed)` : ''}. Times in {d.siteTimeZone}.
        </p>
      )}
      {d.before && d.changes.length === 0 && <EmptyState title="The re-decode changed no reading" />}
      {d.changes.length > 0 && (narrow ? (
        <ul className="divide-y divide-ink-100" aria-label="Changed readings">
          {d.changes.map((c) => (
            <li key={c.readingId} className="py-2 text-sm">
              <div className="flex items-start justify-between gap-3"><Value v={c.before} /><span aria-hidden>→</span><Value v={c.after} /></div>
              <div className="text-xs text-ink-600">{c.point} · {c.probe} · {when(c.timestamp)}</div>
            </li>
          ))}
        </ul>
      ) : (
        <div className="scroll-x">
          <table className="min-w-full text-sm" aria-label="Changed readings">
            <thead className="bg-ink-50 text-left text-xs uppercase tracking-wide text-ink-500">
              <tr><th scope="col" className="px-3 py-2">Point</th><th scope="col" className="px-3 py-2">Probe</th><th scope="col" className="px-3 py-2">Time</th><th scope="col" className="px-3 py-2">Before ({label})</th><th scope="col" className="px-3 py-2">After ({label})</th></tr>
            </thead>
            <tbody className="divide-y divide-ink-100">
              {d.changes.map((c) => (
                <tr key={c.readingId} className="align-top">
                  <th scope="row" className="px-3 py-2 text-left font-medium">{c.point}</th>
                  <td className="px-3 py-2">{c.probe}</td>
                  <td className="num px-3 py-2">{when(c.timestamp)}</td>
                  <td className="px-3 py-2"><Value v={c.before} /></td>
                  <td className="px-3 py-2"><Value v={c.after} /></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ))}
    </div>
  );
}
