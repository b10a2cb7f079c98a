import { useState, type FormEvent } from 'react';
import { ELEMENT_KIND_LABELS, type ElementVerdict, type EmergencySurvey } from '@shared/schemas/emergency';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useUnits } from '@/lib/units';
import { useSetResponseTimes } from '../api/set-response-times';
import { EmergencyVerdictBadge } from './emergency-verdict';

const PASS_WORD = { initial: 'Initial', end_of_duration: 'End of duration' } as const;
const ROLE_WORD = { centre_line: 'Centre line', central_band: 'Central band', area: 'Area', border: 'Border (not judged)', equipment: 'Equipment' } as const;

/** One card per route, area and equipment point: verdict, worst point, every check and why, response times, and each reading with its uncertainty. */
export function ElementVerdicts({ survey }: { survey: EmergencySurvey }) {
  return (
    <div className="space-y-4">
      {survey.elements.map((e) => <ElementCard key={e.element.id} e={e} survey={survey} />)}
    </div>
  );
}

function ElementCard({ e, survey }: { e: ElementVerdict; survey: EmergencySurvey }) {
  const { format, unit } = useUnits();
  const el = e.element;
  const fmtCheck = (c: ElementVerdict['checks'][number]) => {
    // The check's text is in lux (the core's unit); in foot-candles, add the figures converted.
    if (unit === 'lx' || c.value === null || c.kind === 'response' || c.kind === 'route_width' || c.kind === 'max_min_ratio' || c.kind === 'min_over_max') return c.text;
    return `${c.text} (${format(c.value)} against ${format(c.limit)})`;
  };
  return (
    <Card data-testid={`element-${el.code}`}>
      <CardHeader
        title={<span><span className="num mr-2 text-ink-500">{el.code}</span>{el.name}</span>}
        description={`${ELEMENT_KIND_LABELS[el.kind]}${el.stair ? ', stair' : ''} · ${e.planName}`}
        actions={<EmergencyVerdictBadge verdict={e.verdict} />}
      />
      <CardBody className="space-y-3 text-sm">
        {e.worstPoint && (
          <p data-testid="worst-point">
            Worst point <span className="num font-medium">{e.worstPoint.label}</span> ({PASS_WORD[e.worstPoint.pass].toLowerCase()} pass):{' '}
            <span className="num font-medium">{format(e.worstPoint.lux, { bound: e.worstPoint.luxBound })} ± {format(e.worstPoint.uLux)}</span>
          </p>
        )}
        {el.stair && <p className="rounded-lg bg-lamp-50 px-3 py-2 text-lamp-900 ring-1 ring-lamp-200">A stair: each tread needs light, and a competent person checks the stair on site.</p>}
        <ul className="space-y-1.5" aria-label={`Checks of ${el.code}`}>
          {e.checks.map((c, i) => (
            <li key={`${c.checkId}-${c.pass}-${i}`} className="flex flex-wrap items-start gap-2">
              <EmergencyVerdictBadge verdict={c.verdict} />
              {c.pass && <Badge>{PASS_WORD[c.pass]}</Badge>}
              <span className="min-w-0 basis-full sm:basis-0 sm:flex-1">
                {fmtCheck(c)}
                {c.roundingNote && <span className="mt-0.5 block text-xs text-unsure-700">{c.roundingNote}</span>}
                <span className="mt-0.5 block text-xs text-ink-500">{c.source}</span>
              </span>
            </li>
          ))}
        </ul>
        {e.reasons.filter((r) => !e.checks.some((c) => c.text === r)).map((r) => <p key={r} className="text-ink-600">{r}</p>)}
        {e.unmeasured.map((u) => <p key={u.pass} className="text-xs text-unsure-700">Not measured in the {PASS_WORD[u.pass].toLowerCase()} pass: <span className="num">{u.labels.join(', ')}</span></p>)}
        {el.kind !== 'safety_equipment' && <ResponseTimes e={e} survey={survey} />}
        {e.points.length > 0 && (
          <details>
            <summary className="cursor-pointer font-medium text-ink-800">Readings ({e.points.length})</summary>
            <div className="mt-2 scroll-x">
              <table className="w-full min-w-[30rem] text-left text-xs">
                <thead className="text-ink-500"><tr><th className="py-1 pr-2">Point</th><th className="pr-2">Where</th><th className="pr-2">Pass</th><th className="pr-2">E ± U (k = 2)</th><th className="pr-2">Limit</th><th>Verdict</th></tr></thead>
                <tbody>
                  {e.points.map((p) => (
                    <tr key={p.readingId} className="border-t border-ink-100">
                      <td className="num py-1 pr-2">{p.label}</td>
                      <td className="pr-2">{ROLE_WORD[p.role]}</td>
                      <td className="pr-2">{PASS_WORD[p.pass]}</td>
                      <td className="num pr-2">{format(p.lux, { bound: p.luxBound })} ± {format(p.uLux)}{p.flag !== 'ok' && <span className="ml-1 text-unsure-700">({p.flag.replace('_', ' ')})</span>}</td>
                      <td className="num pr-2">{p.limitLux === null ? '–' : `≥ ${format(p.limitLux)}`}</td>
                      <td><EmergencyVerdictBadge verdict={p.verdict} /></td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </details>
        )}
      </CardBody>
    </Card>
  );
}

function ResponseTimes({ e, survey }: { e: ElementVerdict; survey: EmergencySurvey }) {
  const [half, setHalf] = useState(e.response?.toHalfS?.toString() ?? '');
  const [full, setFull] = useState(e.response?.toFullS?.toString() ?? '');
  const save = useSetResponseTimes();
  if (!survey.canEdit) {
    return <p className="text-ink-600">Response: {e.response ? `half the level in ${e.response.toHalfS ?? '–'} s, all of it in ${e.response.toFullS ?? '–'} s` : 'not recorded'}.</p>;
  }
  const submit = (ev: FormEvent) => {
    ev.preventDefault();
    const n = (s: string) => (s.trim() === '' ? null : Number(s.replace(',', '.')));
    save.mutate({ surveyId: survey.surveyId, elementId: e.element.id, body: { toHalfS: n(half), toFullS: n(full) } });
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-2" aria-label={`Response times of ${e.element.code}`}>
      <TextField className="w-36" label="Seconds to half" inputMode="decimal" value={half} onChange={(ev) => setHalf(ev.target.value)} />
      <TextField className="w-36" label="Seconds to all" inputMode="decimal" value={full} onChange={(ev) => setFull(ev.target.value)} />
      <Button type="submit" variant="secondary" size="sm" busy={save.isPending}>Save times</Button>
      <FormError error={save.error} />
    </form>
  );
}
