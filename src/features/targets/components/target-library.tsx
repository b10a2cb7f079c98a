import { useMemo, useState } from 'react';
import { Lock, Pencil } from 'lucide-react';
import { CONFIDENCE_LABELS, type TargetEntry } from '@shared/schemas/targets';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { formatNumber, useUnits } from '@/lib/units';
import { TargetForm } from './target-form';

/** The library: shipped entries (read-only) and the organisation's own, filterable; admins edit their own. */
export function TargetLibrary({ items, canEdit }: { items: TargetEntry[]; canEdit: boolean }) {
  const { format } = useUnits();
  const [filter, setFilter] = useState('');
  const [editing, setEditing] = useState<number | null>(null);
  const shown = useMemo(() => {
    const f = filter.trim().toLowerCase();
    return f ? items.filter((t) => `${t.useType} ${t.name} ${t.source}`.toLowerCase().includes(f)) : items;
  }, [items, filter]);
  return (
    <div>
      <div className="px-5 pt-4"><TextField label="Filter" placeholder="use type, name or source" value={filter} onChange={(e) => setFilter(e.target.value)} className="max-w-sm" /></div>
      <div className="mt-3 scroll-x">
        <table className="min-w-full text-sm">
          <caption className="sr-only">Target library</caption>
          <thead className="bg-ink-50 text-left text-xs font-semibold uppercase tracking-wide text-ink-600">
            <tr>
              <th scope="col" className="px-5 py-2">Use type</th>
              <th scope="col" className="px-3 py-2 text-right">Em required</th>
              <th scope="col" className="px-3 py-2 text-right">Modified</th>
              <th scope="col" className="px-3 py-2 text-right">As stated</th>
              <th scope="col" className="px-3 py-2 text-right">U0</th>
              <th scope="col" className="px-3 py-2 text-right">DF</th>
              <th scope="col" className="px-3 py-2">EN 12464-1:2021 further values</th>
              <th scope="col" className="px-3 py-2">Source</th>
              <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>
            </tr>
          </thead>
          <tbody className="divide-y divide-ink-100">
            {shown.map((t) => editing === t.id ? (
              <tr key={t.id}><td colSpan={9} className="bg-ink-50/60 px-5 py-4"><TargetForm entry={t} onDone={() => setEditing(null)} /></td></tr>
            ) : (
              <tr key={t.id} className="align-top">
                <th scope="row" className="px-5 py-2 text-left">
                  <span className="block font-medium text-ink-900">{t.name}</span>
                  <code className="text-xs text-ink-500">{t.useType}</code>
                </th>
                <td className="num px-3 py-2 text-right">{format(t.emLux)}</td>
                <td className="num px-3 py-2 text-right">{t.emModifiedLux === null ? '–' : format(t.emModifiedLux)}</td>
                <td className="num px-3 py-2 text-right text-ink-600">{formatNumber(t.emSourceValue)} {t.sourceUnit}</td>
                <td className="num px-3 py-2 text-right">{t.u0Min === null ? '–' : t.u0Min.toFixed(2)}</td>
                <td className="num px-3 py-2 text-right">{t.dfTargetPercent === undefined ? '–' : `${t.dfTargetPercent} %`}</td>
                <td className="num px-3 py-2 text-xs text-ink-700">
                  {t.ezLux !== null && <span className="block">Ez {format(t.ezLux)}</span>}
                  {t.emWallLux !== null && <span className="block">Walls {format(t.emWallLux)}, U0 ≥ {t.surfaceU0Min.toFixed(2)}</span>}
                  {t.emCeilingLux !== null && <span className="block">Ceiling {format(t.emCeilingLux)}, U0 ≥ {t.surfaceU0Min.toFixed(2)}</span>}
                  {(t.ra !== null || t.rugl !== null) && <span className="block" title="For information: an illuminance meter cannot measure colour rendering or glare.">Ra {t.ra ?? '–'}, RUGL {t.rugl ?? '–'} (information only)</span>}
                  {t.ezLux === null && t.emWallLux === null && t.emCeilingLux === null && t.ra === null && t.rugl === null && '–'}
                </td>
                <td className="px-3 py-2">
                  <span className="block text-ink-700">{t.source}</span>
                  <span className="mt-1 flex flex-wrap gap-1">
                    <Badge tone={t.confidence === 'published' ? 'info' : 'warn'}>{CONFIDENCE_LABELS[t.confidence]}</Badge>
                    {t.shipped ? <Badge icon={<Lock className="h-3 w-3" aria-hidden />}>Shipped</Badge> : <Badge tone="good">Your organisation</Badge>}
                  </span>
                </td>
                <td className="px-3 py-2 text-right">
                  {canEdit && !t.shipped && <Button size="sm" variant="ghost" onClick={() => setEditing(t.id)} aria-label={`Edit ${t.name}`}><Pencil className="h-4 w-4" aria-hidden />Edit</Button>}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
