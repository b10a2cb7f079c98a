import { useId, useState } from 'react';
import { Check } from 'lucide-react';
import type { FieldState } from '@shared/schemas/field';
import { formatClock } from '@shared/datetime';
import { cx } from '@/components/ui/cx';
import type { OutboxItem } from '../offline/field-db';
import { newKey, outboxRecord } from '../offline/field-db';
import { PhotoPicker } from './photo-picker';
import type { ZoneItem } from '../field-model';

const BIG = 'min-h-11 rounded-xl px-4 text-base font-semibold';
const INPUT = 'block w-full min-h-11 rounded-xl border-0 bg-white px-3 text-base text-ink-950 ring-2 ring-inset ring-ink-400 focus:ring-4 focus:ring-lamp-500';
const SYNC_LABEL = { synced: 'Synced', waiting: 'Waiting to sync', refused: 'Refused' } as const;

/**
 * Notes and photos on a whole zone (what no single point shows: a dead luminaire, glare, a
 * blocked window). Like point records they go to the phone's outbox first with their own key.
 */
export function FieldZoneNotes({ state, zoneId, onZone, items, sessionKey, onAdd }: {
  state: FieldState;
  zoneId: number;
  onZone: (zoneId: number) => void;
  items: ZoneItem[];
  sessionKey: string | null;
  onAdd: (item: OutboxItem) => Promise<void>;
}) {
  const [note, setNote] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [keepLocation, setKeepLocation] = useState(false);
  const zone = state.zones.find((z) => z.id === zoneId);
  const selectId = useId();
  const accepts = state.survey.acceptsRecords;

  const saveNote = async () => {
    const text = note.trim();
    if (!text) { setProblem('Write the note first'); return; }
    setProblem(null);
    await onAdd(outboxRecord(state.survey.id, { kind: 'zone_note', zoneId, note: text, sessionKey, recordedAt: new Date().toISOString() }));
    setNote('');
    setSaved(`Note kept for ${zone?.name ?? 'the zone'}`);
  };

  const addPhoto = async (file: File) => {
    setProblem(null);
    const key = newKey();
    const caption = note.trim();
    await onAdd({
      key, surveyId: state.survey.id, kind: 'photo', state: 'waiting', reason: null, createdAt: Date.now(), blob: file,
      body: { idempotencyKey: key, takenAt: new Date().toISOString(), zoneId, ...(caption ? { note: caption } : {}), keepLocation, filename: file.name || 'photo.jpg' },
    });
    setNote('');
    setSaved(`Photo kept for ${zone?.name ?? 'the zone'}`);
  };

  return (
    <section aria-labelledby="zone-notes-title" className="rounded-2xl bg-white p-4 ring-1 ring-ink-300">
      <h2 id="zone-notes-title" className="text-base font-bold text-ink-950">Notes and photos of the zone</h2>
      <label htmlFor={selectId} className="mt-2 block text-sm font-semibold text-ink-900">Zone</label>
      <select id={selectId} className={cx(INPUT, 'mt-1')} value={zoneId} onChange={(e) => { onZone(Number(e.target.value)); setSaved(null); }}>
        {state.zones.map((z) => <option key={z.id} value={z.id}>{z.name}</option>)}
      </select>
      {accepts && (
        <>
          <label className="mt-3 block text-sm font-semibold text-ink-900">Note on the zone (also the caption of a photo taken now)
            <textarea className={cx(INPUT, 'mt-1 py-2')} rows={2} value={note} onChange={(e) => setNote(e.target.value)} maxLength={1000} />
          </label>
          <div className="mt-3 flex flex-wrap items-center gap-3">
            <button type="button" onClick={() => void saveNote()} className={cx(BIG, 'flex items-center gap-2 bg-meets-700 text-white')}>
              <Check className="h-5 w-5" aria-hidden />Save zone note
            </button>
            <PhotoPicker label="Zone photo" keepLocation={keepLocation} onKeepLocation={setKeepLocation} onFile={(f) => void addPhoto(f)} />
          </div>
        </>
      )}
      {problem && <p role="alert" className="mt-3 rounded-lg bg-short-50 p-3 text-sm font-semibold text-short-700">{problem}</p>}
      {saved && !problem && <p role="status" className="mt-3 rounded-lg bg-meets-50 p-3 text-sm font-semibold text-meets-700">{saved}</p>}
      {items.length === 0 ? <p className="mt-3 text-sm text-ink-700">No notes or photos of this zone yet.</p> : (
        <ul className="mt-3 flex flex-col gap-2" data-testid="zone-items">
          {items.map((i) => (
            <li key={i.key} className="rounded-lg bg-ink-50 p-3 text-sm text-ink-950">
              <div className="flex flex-wrap justify-between gap-2">
                <strong>{i.kind === 'photo' ? 'Photo' : 'Note'} · {formatClock(i.at, state.survey.siteTimeZone)}</strong>
                <span className={cx('font-semibold', i.sync === 'refused' ? 'text-short-700' : i.sync === 'waiting' ? 'text-unsure-700' : 'text-meets-700')}>{SYNC_LABEL[i.sync]}</span>
              </div>
              {i.url && <img src={i.url} alt={i.note ?? `Photo of ${zone?.name ?? 'the zone'}`} className="mt-2 max-h-40 rounded-lg" loading="lazy" />}
              {i.note && <p className="mt-1 whitespace-pre-line">{i.note}</p>}
              {i.reason && <p className="font-semibold text-short-700">{i.reason}</p>}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
