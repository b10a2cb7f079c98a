import { Link } from 'react-router';
import { Ruler, Shapes } from 'lucide-react';
import type { Plan } from '@shared/schemas/plans';
import { Badge } from '@/components/ui/badge';
import { paths } from '@shared/paths';

const m = (v: number) => (Math.round(v * 10) / 10).toLocaleString('en-GB');

export function PlanList({ plans }: { plans: readonly Plan[] }) {
  return (
    <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
      {plans.map((p) => (
        <li key={p.id}>
          <Link to={paths.plan.to(p.id)} className="group block overflow-hidden rounded-xl bg-white shadow-card ring-1 ring-ink-100 transition hover:ring-lamp-300">
            <div className="flex aspect-[16/9] items-center justify-center bg-ink-50">
              <img src={p.imageUrl} alt="" loading="lazy" className="max-h-full max-w-full object-contain" />
            </div>
            <div className="space-y-1 px-4 py-3">
              <div className="font-semibold text-ink-900 group-hover:text-lamp-800">{p.name}</div>
              <div className="flex flex-wrap gap-2 text-xs">
                {p.widthM !== null && p.heightM !== null
                  ? <Badge tone="info" icon={<Ruler className="h-3 w-3" aria-hidden />}>{m(p.widthM)} × {m(p.heightM)} m</Badge>
                  : <Badge tone="warn" icon={<Ruler className="h-3 w-3" aria-hidden />}>Scale not set</Badge>}
                <Badge icon={<Shapes className="h-3 w-3" aria-hidden />}>{p.zoneCount} zone{p.zoneCount === 1 ? '' : 's'}</Badge>
              </div>
            </div>
          </Link>
        </li>
      ))}
    </ul>
  );
}
