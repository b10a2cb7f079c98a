import type { AuditEvent } from '@shared/schemas/audit';
import { formatDateTime } from '@shared/datetime';
import { describeAuditEvent } from '@shared/audit-labels';


function stringify(v: unknown) {
  return typeof v === 'object' && v !== null ? JSON.stringify(v) : String(v);
}

/** Fields that differ between before and after (or every field when one side is absent). */
function changes(e: AuditEvent): { key: string; before: string | null; after: string | null }[] {
  const b = (e.before ?? {}) as Record<string, unknown>;
  const a = (e.after ?? {}) as Record<string, unknown>;
  const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])];
  return keys
    .filter((k) => !(e.before && e.after) || stringify(b[k]) !== stringify(a[k]))
    .map((k) => ({ key: k, before: k in b ? stringify(b[k]) : null, after: k in a ? stringify(a[k]) : null }));
}

/** The append-only trail, newest first: who, when, what, and each changed field before and after. */
export function AuditList({ events, probeLabel }: { events: AuditEvent[]; probeLabel?: (probeId: number) => string | undefined }) {
  return (
    <ol className="divide-y divide-ink-100">
      {events.map((e) => (
        <li key={e.id} className="px-5 py-3">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <p className="text-sm text-ink-900">
              <span className="font-semibold">{e.actorName ?? 'Luxtrail'}</span> {describeAuditEvent(e)}
              {e.probeId && probeLabel?.(e.probeId) ? <> of probe <span className="font-medium">{probeLabel(e.probeId)}</span></> : null}
            </p>
            <time dateTime={e.createdAt} className="num text-xs text-ink-500">{formatDateTime(e.createdAt)}</time>
          </div>
          {changes(e).length > 0 && (
            <details className="mt-1">
              <summary className="cursor-pointer text-xs font-medium text-ink-600">{changes(e).length} field{changes(e).length === 1 ? '' : 's'}</summary>
              <div className="mt-1 scroll-x">
                <table className="min-w-full text-xs">
                  <thead className="text-left text-ink-500"><tr><th scope="col" className="pr-3">Field</th><th scope="col" className="pr-3">Before</th><th scope="col">After</th></tr></thead>
                  <tbody className="font-mono text-ink-800">
                    {changes(e).map((c) => (
                      <tr key={c.key} className="border-t border-ink-100 align-top">
                        <td className="py-0.5 pr-3 font-sans font-medium">{c.key}</td>
                        <td className="max-w-xs break-all py-0.5 pr-3">{c.before ?? '–'}</td>
                        <td className="max-w-xs break-all py-0.5">{c.after ?? '–'}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            </details>
          )}
        </li>
      ))}
    </ol>
  );
}
