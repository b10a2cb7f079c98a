import type { ReactNode } from 'react';
import { cx } from './cx';

export type Tone = 'neutral' | 'good' | 'bad' | 'unsure' | 'warn' | 'info';

const TONES: Record<Tone, string> = {
  neutral: 'bg-ink-100 text-ink-700 ring-ink-200',
  good: 'bg-meets-50 text-meets-700 ring-meets-100',
  bad: 'bg-short-50 text-short-700 ring-short-100',
  unsure: 'bg-unsure-50 text-unsure-700 ring-unsure-100',
  warn: 'bg-lamp-50 text-lamp-800 ring-lamp-200',
  info: 'bg-ink-50 text-ink-800 ring-ink-200',
};

export function Badge({ tone = 'neutral', children, className, icon }: { tone?: Tone; children: ReactNode; className?: string; icon?: ReactNode }) {
  return (
    <span className={cx('inline-flex items-center gap-1 whitespace-nowrap rounded-full px-2 py-0.5 text-xs font-medium ring-1 ring-inset', TONES[tone], className)}>
      {icon}
      {children}
    </span>
  );
}
