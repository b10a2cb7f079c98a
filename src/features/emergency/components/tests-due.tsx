import { Link } from 'react-router';
import { paths } from '@shared/paths';
import type { TestDueDto } from '@shared/schemas/emergency';
import { Badge, type Tone } from '@/components/ui/badge';
import { formatCalendarDay } from '@shared/datetime';

const KIND_WORD = { functional: 'Functional test', full_duration: 'Full-duration test' } as const;
const STATE: Record<TestDueDto['state'], { word: (d: TestDueDto) => string; tone: Tone }> = {
  overdue: { word: (d) => `Overdue by ${d.daysOverdue} day${d.daysOverdue === 1 ? '' : 's'}`, tone: 'bad' },
  due_soon: { word: () => 'Due within a week', tone: 'unsure' },
  ok: { word: () => 'In date', tone: 'good' },
  never_tested: { word: () => 'Never recorded', tone: 'neutral' },
};

/** One line per test kind: state (worded, not colour alone), last test and next due date. */
export function DueList({ due }: { due: readonly TestDueDto[] }) {
  return (
    <ul className="space-y-1.5">
      {due.map((d) => (
        <li key={d.kind} className="flex flex-wrap items-center gap-2 text-sm" data-testid={`due-${d.kind}`}>
          <span className="w-36 font-medium text-ink-800">{KIND_WORD[d.kind]}</span>
          <Badge tone={STATE[d.state].tone}>{STATE[d.state].word(d)}</Badge>
          <span className="text-ink-600">
            {d.dueOn ? `due ${formatCalendarDay(d.dueOn)}` : 'due now'}
            {d.lastTestedOn && ` · last ${formatCalendarDay(d.lastTestedOn)} (${d.lastResult === 'fail' ? 'failed' : 'passed'})`}
          </span>
        </li>
      ))}
    </ul>
  );
}

/** Every site's tests, overdue sites first, each linking to its logbook. */
export function SitesDue({ sites }: { sites: readonly { siteId: number; siteName: string; due: TestDueDto[] }[] }) {
  const rank = (s: { due: TestDueDto[] }) => (s.due.some((d) => d.state === 'overdue') ? 0 : s.due.some((d) => d.state === 'due_soon') ? 1 : s.due.every((d) => d.state === 'never_tested') ? 3 : 2);
  return (
    <ul className="divide-y divide-ink-100">
      {[...sites].sort((a, b) => rank(a) - rank(b) || a.siteName.localeCompare(b.siteName)).map((s) => (
        <li key={s.siteId} className="py-3">
          <Link to={paths.emergencyLogbook.to(s.siteId)} className="font-medium text-lamp-800 underline-offset-2 hover:underline">{s.siteName}</Link>
          <div className="mt-1"><DueList due={s.due} /></div>
        </li>
      ))}
    </ul>
  );
}
