import { useUnits } from '@/lib/units';
import { cx } from './cx';

/** The lux / foot-candle switch; every illuminance on screen follows it. */
export function UnitsToggle({ className }: { className?: string }) {
  const { unit, setUnit } = useUnits();
  return (
    <div role="radiogroup" aria-label="Illuminance unit" className={cx('inline-flex rounded-lg bg-ink-800 p-0.5 text-xs font-semibold', className)}>
      {(['lx', 'fc'] as const).map((u) => (
        <button
          key={u}
          type="button"
          role="radio"
          aria-checked={unit === u}
          onClick={() => setUnit(u)}
          className={cx('rounded-md px-2.5 py-1 transition-colors', unit === u ? 'bg-lamp-400 text-ink-950' : 'text-ink-200 hover:text-white')}
        >
          {u === 'lx' ? 'lux' : 'foot-candles'}
        </button>
      ))}
    </div>
  );
}
