import { cx } from './cx';

/** A labelled progress bar; `value` 0..1, or null for work of unknown length. */
export function ProgressBar({ value, label, tone = 'lamp' }: { value: number | null; label: string; tone?: 'lamp' | 'good' | 'bad' }) {
  const pct = value === null ? null : Math.round(Math.max(0, Math.min(1, value)) * 100);
  const bar = tone === 'good' ? 'bg-meets-500' : tone === 'bad' ? 'bg-short-500' : 'bg-lamp-400';
  return (
    <div>
      <div className="mb-1 flex justify-between text-xs text-ink-600">
        <span>{label}</span>
        {pct !== null && <span className="num">{pct}%</span>}
      </div>
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct ?? undefined} className="h-2 overflow-hidden rounded-full bg-ink-100">
        <div className={cx('h-full rounded-full transition-[width] duration-300', bar, pct === null && 'w-1/3 animate-pulse')} style={pct !== null ? { width: `${pct}%` } : undefined} />
      </div>
    </div>
  );
}
