import { useState, type FormEvent } from 'react';
import type { LogbookEntry, SiteLogbook } from '@shared/schemas/emergency';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useAddLogbookEntry } from '../api/add-logbook-entry';
import { formatCalendarDay } from '@shared/datetime';

/** Records a test as it was done: which test, when (site calendar), who, result, failed fittings and remarks. */
export function LogbookEntryForm({ book }: { book: SiteLogbook }) {
  const add = useAddLogbookEntry();
  const [kind, setKind] = useState<'functional' | 'full_duration'>('functional');
  const [testedOn, setTestedOn] = useState(book.today);
  const [testedBy, setTestedBy] = useState('');
  const [result, setResult] = useState<'pass' | 'fail'>('pass');
  const [failed, setFailed] = useState('');
  const [remarks, setRemarks] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    add.mutate({ siteId: book.siteId, body: { kind, testedOn, testedBy, result, failedFittings: result === 'fail' ? failed.split(/[,;\n]+/).map((s) => s.trim()).filter(Boolean) : [], remarks } },
      { onSuccess: () => { setFailed(''); setRemarks(''); } });
  };
  return (
    <form onSubmit={submit} className="space-y-3" aria-label="Record a test">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Test" value={kind} onChange={(e) => setKind(e.target.value as typeof kind)}>
          <option value="functional">Functional (short) test</option>
          <option value="full_duration">Full rated-duration test</option>
        </SelectField>
        <TextField label="Tested on" type="date" value={testedOn} max={book.today} onChange={(e) => setTestedOn(e.target.value)} required />
        <TextField label="Tested by" value={testedBy} onChange={(e) => setTestedBy(e.target.value)} required maxLength={120} />
        <SelectField label="Result" value={result} onChange={(e) => setResult(e.target.value as typeof result)}>
          <option value="pass">Passed: every fitting worked</option>
          <option value="fail">Failed: one or more fittings did not</option>
        </SelectField>
      </div>
      {result === 'fail' && <TextField label="Failed fittings" value={failed} onChange={(e) => setFailed(e.target.value)} hint="Codes or places, separated by commas" />}
      <TextAreaField label="Remarks" value={remarks} onChange={(e) => setRemarks(e.target.value)} rows={2} maxLength={2000} />
      <FormError error={add.error} />
      <Button type="submit" busy={add.isPending}>Record test</Button>
    </form>
  );
}

export function LogbookEntries({ entries, total }: { entries: readonly LogbookEntry[]; total: number }) {
  if (entries.length === 0) return <p className="text-sm text-ink-500">No tests recorded yet.</p>;
  return (
    <div className="scroll-x">
      <table className="w-full min-w-[32rem] text-left text-sm" aria-label="Logbook entries">
        <thead className="text-xs text-ink-500"><tr><th className="py-1 pr-2">Date</th><th className="pr-2">Test</th><th className="pr-2">By</th><th className="pr-2">Result</th><th className="pr-2">Failed fittings</th><th>Remarks</th></tr></thead>
        <tbody>
          {entries.map((e) => (
            <tr key={e.id} className="border-t border-ink-100 align-top">
              <td className="num py-1.5 pr-2">{formatCalendarDay(e.testedOn)}</td>
              <td className="pr-2">{e.kind === 'functional' ? 'Functional' : 'Full duration'}</td>
              <td className="pr-2">{e.testedBy}</td>
              <td className="pr-2"><Badge tone={e.result === 'pass' ? 'good' : 'bad'}>{e.result === 'pass' ? 'Passed' : 'Failed'}</Badge></td>
              <td className="pr-2">{e.failedFittings.join(', ') || '–'}</td>
              <td>{e.remarks || '–'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {total > entries.length && <p className="mt-2 text-xs text-ink-500">Showing the latest {entries.length} of {total}.</p>}
    </div>
  );
}
