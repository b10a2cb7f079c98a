import { Link, useParams } from 'react-router';
import { paths } from '@shared/paths';
import { useDecodeChanges } from '@/features/surveys/api/get-decode-changes';
import { DecodeChangesView } from '@/features/surveys/components/decode-changes-view';
import { Card, CardBody } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { QueryState } from '@/components/ui/states';

/** Read-only: what the latest re-decode of a survey changed, for whoever may re-decode (calibration staff, administrators). */
export function DecodeChangesRoute() {
  const surveyId = Number(useParams().surveyId);
  const changes = useDecodeChanges(surveyId);
  return (
    <Page>
      <QueryState query={changes} loadingLabel="Comparing the decodes…">
        {(d) => (
          <>
            <PageHeader eyebrow={<Link to={paths.calibration.to()} className="hover:underline">Calibration · {d.siteName}</Link>} title={`Re-decode of ${d.surveyName}`}
              description="Each reading the latest re-decode changed, before and after. Read-only." />
            <Card><CardBody><DecodeChangesView d={d} /></CardBody></Card>
          </>
        )}
      </QueryState>
    </Page>
  );
}
