import { useEffect, useMemo, useRef, useState } from 'react';
import type { Plan } from '@shared/schemas/plans';
import type { FieldPoint } from '../field-model';

const STATE_TEXT = { todo: 'to do', measured: 'measured', skipped: 'skipped' } as const;

/**
 * The plan at scale with its points: to do (hollow ring), measured (filled disc with a tick),
 * skipped (cross), the next point with a thick ring and the chosen one outlined. Every point is
 * a button at least 44 px across; tapping the plan elsewhere offers a new point there.
 */
export function FieldPlan({ plan, image, points, nextId, selectedId, onSelect, onPlace, placed }: {
  plan: Plan;
  image: Blob | null;
  points: FieldPoint[];
  nextId: string | null;
  selectedId: string | null;
  onSelect: (id: string) => void;
  onPlace: (xM: number, yM: number) => void;
  placed: { xM: number; yM: number } | null;
}) {
  // The copy kept on the phone when there is one, so the plan shows with the network off.
  const blobUrl = useMemo(() => (image ? URL.createObjectURL(image) : null), [image]);
  useEffect(() => () => { if (blobUrl) URL.revokeObjectURL(blobUrl); }, [blobUrl]);
  const src = blobUrl ?? plan.imageUrl;

  const w = plan.widthM ?? plan.widthPx;
  const h = plan.heightM ?? plan.heightPx;
  // Touch targets: 44 CSS px whatever the zoom; the plan is drawn at the container's width.
  const [boxPx, setBoxPx] = useState(360);
  const ref = useRef<SVGSVGElement | null>(null);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setBoxPx(el.clientWidth || 360));
    ro.observe(el);
    return () => ro.disconnect();
  }, [ref]);
  const mPerPx = w / boxPx;
  const r = 22 * mPerPx;

  const onPlanClick = (e: React.MouseEvent<SVGSVGElement>) => {
    if (plan.widthM === null) return;
    const svg = e.currentTarget;
    const pt = svg.createSVGPoint();
    pt.x = e.clientX;
    pt.y = e.clientY;
    const m = svg.getScreenCTM();
    if (!m) return;
    const p = pt.matrixTransform(m.inverse());
    onPlace(Math.round(p.x * 100) / 100, Math.round((h - p.y) * 100) / 100);
  };

  const onPlan = points.filter((p) => p.planId === plan.id && p.xM !== null && p.yM !== null);
  return (
    <svg
      ref={ref}
      viewBox={`0 0 ${w} ${h}`}
      className="block h-auto w-full touch-manipulation select-none rounded-lg bg-white ring-1 ring-ink-300"
      role="group"
      aria-label={`Plan ${plan.name} with ${onPlan.length} points; tap an empty spot to record a new point there`}
      onClick={onPlanClick}
    >
      <image href={src} x={0} y={0} width={w} height={h} preserveAspectRatio="none" />
      {placed && (
        <g transform={`translate(${placed.xM} ${h - placed.yM})`} aria-hidden>
          <circle r={r * 0.7} fill="none" stroke="#1d4ed8" strokeWidth={r * 0.25} strokeDasharray={`${r * 0.4} ${r * 0.25}`} />
        </g>
      )}
      {onPlan.map((p) => {
        const next = p.id === nextId;
        const selected = p.id === selectedId;
        const fill = p.state === 'measured' ? '#166534' : p.state === 'skipped' ? '#57534e' : '#ffffff';
        return (
          <g
            key={p.id}
            transform={`translate(${p.xM} ${h - p.yM!})`}
            role="button"
            tabIndex={0}
            aria-label={`Point ${p.label}, ${STATE_TEXT[p.state]}${next ? ', next' : ''}`}
            aria-pressed={selected}
            onClick={(e) => { e.stopPropagation(); onSelect(p.id); }}
            onKeyDown={(e) => { if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); onSelect(p.id); } }}
            className="cursor-pointer focus:outline-none"
          >
            <circle r={r} fill="transparent" />
            {next && <circle r={r * 0.95} fill="none" stroke="#b45309" strokeWidth={r * 0.22} />}
            {selected && <circle r={r * 0.75} fill="none" stroke="#1d4ed8" strokeWidth={r * 0.2} />}
            <circle r={r * 0.45} fill={fill} stroke="#0f172a" strokeWidth={r * 0.12} />
            {p.state === 'measured' && <path d={`M${-r * 0.22} 0 L${-r * 0.05} ${r * 0.18} L${r * 0.25} ${-r * 0.2}`} stroke="#fff" strokeWidth={r * 0.1} fill="none" />}
            {p.state === 'skipped' && <path d={`M${-r * 0.2} ${-r * 0.2} L${r * 0.2} ${r * 0.2} M${r * 0.2} ${-r * 0.2} L${-r * 0.2} ${r * 0.2}`} stroke="#fff" strokeWidth={r * 0.1} />}
            <text y={-r * 0.6} textAnchor="middle" fontSize={r * 0.55} fontWeight={700} fill="#0f172a" stroke="#fff" strokeWidth={r * 0.12} paintOrder="stroke">{p.label}</text>
          </g>
        );
      })}
    </svg>
  );
}
