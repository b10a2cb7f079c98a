import { useEffect, useState } from 'react';
import { Link } from 'react-router';
import { ChevronRight } from 'lucide-react';
import { useSurveys } from '@/features/surveys/api/get-surveys';
import { SURVEY_STATUS_LABELS } from '@shared/schemas/surveys';
import { listSnapshots, type OfflineSnapshot } from '@/features/field/offline/field-db';
import { useOnline } from '@/features/field/offline/use-field-survey';
import { paths } from '@shared/paths';

/** Choose a survey to measure: the open ones from the server, and those kept on this phone. */
export function FieldIndexRoute() {
  const online = useOnline();
  const surveys = useSurveys();
  const [kept, setKept] = useState<OfflineSnapshot[]>([]);
  useEffect(() => { void listSnapshots().then(setKept); }, []);
  const open = (surveys.data?.items ?? []).filter((s) => s.status === 'draft' || s.status === 'returned');
  const keptIds = new Set(kept.map((k) => k.surveyId));
  const offlineOnly = kept.filter((k) => !open.some((s) => s.id === k.surveyId));

  return (
    <div className="mx-auto flex w-full max-w-3xl flex-col gap-4 p-3 sm:p-4">
      <h1 className="text-xl font-bold">Measure in the field</h1>
      <p className="text-base text-ink-800">Choose a survey. Take it offline before you lose the signal: its plans and points stay on this phone, and what you record waits here until the connection returns.</p>
      {!online && <p className="rounded-xl bg-ink-900 p-3 text-base font-semibold text-white">Offline: only surveys kept on this phone can be opened.</p>}
      {surveys.isPending && online && <p role="status">Loading surveys…</p>}
      {surveys.isError && online && <p role="alert" className="rounded-xl bg-short-50 p-3 text-short-700">{surveys.error.message}</p>}
      <ul className="flex flex-col gap-2">
        {[...open.map((s) => ({ id: s.id, name: s.name, site: s.siteName, status: SURVEY_STATUS_LABELS[s.status] })), ...offlineOnly.map((k) => ({ id: k.surveyId, name: k.state.survey.name, site: k.state.survey.siteName, status: 'kept on this phone' }))].map((s) => (
          <li key={s.id}>
            <Link to={paths.fieldSurvey.to(s.id)} className="flex min-h-14 items-center justify-between rounded-xl bg-white px-4 py-2 text-base ring-2 ring-inset ring-ink-300 focus:ring-4 focus:ring-lamp-500">
              <span><span className="block font-bold">{s.name}</span><span className="text-sm text-ink-700">{s.site} · {s.status}{keptIds.has(s.id) ? ' · offline copy' : ''}</span></span>
              <ChevronRight className="h-5 w-5" aria-hidden />
            </Link>
          </li>
        ))}
      </ul>
      {online && surveys.isSuccess && open.length === 0 && offlineOnly.length === 0 && <p className="text-base text-ink-700">No survey is open for measuring. Start one on the Surveys page.</p>}
    </div>
  );
}

