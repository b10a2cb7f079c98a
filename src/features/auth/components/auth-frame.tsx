import type { ReactNode } from 'react';
import { LuxtrailMark } from '@/components/brand/luxtrail-mark';

/** The frame around sign-in, invitation and reset forms. */
export function AuthFrame({ title, subtitle, children, footer }: { title: string; subtitle?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="grid min-h-screen lg:grid-cols-[1.1fr_1fr]">
      <aside className="relative hidden overflow-hidden bg-ink-900 p-12 text-ink-100 lg:flex lg:flex-col lg:justify-between">
        <LuxtrailMark className="h-9 text-white" />
        <div className="relative z-10 max-w-md">
          <p className="text-3xl font-semibold leading-tight text-white">Every point of a walk-through, decoded, placed and judged.</p>
          <p className="mt-4 text-ink-300">From raw probe counts to room verdicts your facility team can sign off.</p>
        </div>
        <svg aria-hidden className="absolute -bottom-10 -right-10 h-[28rem] w-[28rem] opacity-60" viewBox="0 0 200 200">
          <defs>
            <radialGradient id="glow" cx="0.7" cy="0.3" r="0.7"><stop offset="0" stopColor="#f5b53d" stopOpacity="0.55" /><stop offset="1" stopColor="#f5b53d" stopOpacity="0" /></radialGradient>
          </defs>
          <circle cx="140" cy="60" r="90" fill="url(#glow)" />
          <path d="M10 190 C 60 170, 110 120, 140 60" stroke="#f5b53d" strokeWidth="2" fill="none" strokeDasharray="2 7" strokeLinecap="round" />
          {[[30, 180], [62, 163], [92, 138], [118, 104]].map(([x, y]) => <circle key={x} cx={x} cy={y} r="3.5" fill="#ffd98a" />)}
        </svg>
        <p className="relative z-10 text-xs text-ink-400">Luxtrail supports illuminance surveys; it does not replace local codes or a qualified lighting professional.</p>
      </aside>
      <main className="flex items-center justify-center px-4 py-10 sm:px-8">
        <div className="w-full max-w-sm">
          <LuxtrailMark className="mb-8 h-8 text-ink-900 lg:hidden" />
          <h1 className="text-2xl font-semibold text-ink-950">{title}</h1>
          {subtitle && <p className="mt-1 text-sm text-ink-600">{subtitle}</p>}
          <div className="mt-6">{children}</div>
          {footer && <div className="mt-6 text-sm text-ink-600">{footer}</div>}
        </div>
      </main>
    </div>
  );
}
