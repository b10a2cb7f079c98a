import { useUnits } from '@/lib/units';
import { SHAPE_LEGEND, type MarkerShape } from './marker-shapes';

const SHAPE_PATHS: Record<MarkerShape, string> = {
  circle: 'M12 6a6 6 0 1 0 0.001 0Z',
  ring: 'M12 6a6 6 0 1 0 0.001 0Z',
  diamond: 'M12 3.5 20.5 12 12 20.5 3.5 12Z',
  'triangle-up': 'M12 4 19 17H5Z',
  'triangle-down': 'M12 20 19 7H5Z',
  square: 'M6 6h12v12H6Z',
  cross: 'M6 6 18 18M18 6 6 18',
};

export function ShapeIcon({ shape, fill = '#7a8591' }: { shape: MarkerShape; fill?: string }) {
  const hollow = shape === 'ring' || shape === 'cross';
  return (
    <svg viewBox="0 0 24 24" className="h-4 w-4 shrink-0" aria-hidden>
      <path d={SHAPE_PATHS[shape]} fill={hollow ? 'none' : fill} stroke={shape === 'cross' ? '#b42318' : shape === 'ring' ? fill : '#1d232b'} strokeWidth={hollow ? 2.5 : 1.2} />
    </svg>
  );
}

/** The colour bar in the app's unit (lux or foot-candles) with the EN 12464-1 steps as ticks. */
export function LuxLegend({ gradient, ticks, position }: { gradient: string[]; ticks: readonly number[]; position: (lux: number) => number }) {
  const { format, label } = useUnits();
  return (
    <figure aria-label={`Colour scale in ${label === 'fc' ? 'foot-candles' : 'lux'}`} className="min-w-0">
      <figcaption className="mb-1 text-xs font-medium text-ink-700">Illuminance ({label}, log scale)</figcaption>
      <div className="h-3 rounded" style={{ background: `linear-gradient(to right, ${gradient.join(', ')})` }} />
      <div className="relative mt-1 h-4 text-[10px] text-ink-600">
        {ticks.map((t) => (
          <span key={t} className="absolute -translate-x-1/2 whitespace-nowrap" style={{ left: `${Math.min(100, Math.max(0, position(t) * 100))}%` }}>{format(t, { withUnit: false })}</span>
        ))}
      </div>
    </figure>
  );
}

export function DifferenceLegend({ gradient, maxAbs }: { gradient: string[]; maxAbs: number }) {
  const { format, label } = useUnits();
  return (
    <figure aria-label="Colour scale of the change" className="min-w-0">
      <figcaption className="mb-1 text-xs font-medium text-ink-700">Change since the earlier survey ({label})</figcaption>
      <div className="h-3 rounded" style={{ background: `linear-gradient(to right, ${gradient.join(', ')})` }} />
      <div className="mt-1 flex justify-between text-[10px] text-ink-600">
        <span>−{format(maxAbs, { withUnit: false })} darker</span><span>no change</span><span>+{format(maxAbs, { withUnit: false })} brighter</span>
      </div>
    </figure>
  );
}

export function ShapeLegend({ shapes }: { shapes?: MarkerShape[] }) {
  const items = shapes ? SHAPE_LEGEND.filter((s) => shapes.includes(s.shape)) : SHAPE_LEGEND;
  return (
    <ul aria-label="Marker shapes" className="grid grid-cols-1 gap-x-4 gap-y-1 text-xs text-ink-700 sm:grid-cols-2">
      {items.map((s) => (
        <li key={s.shape} className="flex items-center gap-2"><ShapeIcon shape={s.shape} />{s.label}</li>
      ))}
    </ul>
  );
}
