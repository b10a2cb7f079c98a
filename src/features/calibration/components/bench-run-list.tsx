import { Link } from 'react-router';
import type { BenchRunDto } from '@shared/schemas/bench-runs';
import { Badge } from '@/components/ui/badge';
import { formatInstant } from './format';
import { paths } from '@shared/paths';

export function BenchRunList({ runs }: { runs: BenchRunDto[] }) {
  return (
    <ul className="divide-y divide-ink-100">
      {runs.map((r) => (
        <li key={r.id} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
          <div>
            <Link to={paths.benchRun.to(r.id)} className="font-medium text-ink-900 underline-offset-2 hover:underline">Bench run #{r.id}: {r.filename}</Link>
            <div className="text-xs text-ink-500">{r.rowCount} rows · codes {r.gains.map((g) => g.code).join(', ')} · {r.createdBy ?? 'unknown'} · {formatInstant(r.createdAt)}</div>
          </div>
          {r.issues.length > 0 ? <Badge tone="warn">{r.issues.length} flag{r.issues.length === 1 ? '' : 's'}</Badge> : <Badge tone="good">No flags</Badge>}
        </li>
      ))}
    </ul>
  );
}
