import type { ProbeDto } from '@shared/schemas/probes';
import { PROBE_KIND_LABELS, PROBE_STATUS_LABELS } from '@shared/schemas/probes';
import { useUnits } from '@/lib/units';
import { CalibrationStateBadge } from './calibration-state-badge';
import { formatDueDate } from './format';

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="flex justify-between gap-4 py-1.5">
      <dt className="text-ink-600">{label}</dt>
      <dd className="text-right font-medium text-ink-900">{children}</dd>
    </div>
  );
}

/** A probe's properties and its calibration in force. */
export function ProbeSummary({ probe }: { probe: ProbeDto }) {
  const { format } = useUnits();
  return (
    <dl className="divide-y divide-ink-100 text-sm">
      <Row label="Kind">{PROBE_KIND_LABELS[probe.kind]}</Row>
      <Row label="Status">{PROBE_STATUS_LABELS[probe.status]}</Row>
      <Row label="Calibration"><CalibrationStateBadge state={probe.calibrationState} /></Row>
      <Row label="Set in force">{probe.currentSet ? `v${probe.currentSet.version} · ${probe.currentSet.certificateNumber}` : 'none'}</Row>
      <Row label="Due date"><span className="num">{formatDueDate(probe.currentSet?.dueDate)}</span></Row>
      {probe.kind === 'counts' ? (
        <>
          <Row label="ADC full scale"><span className="num">{probe.fullScaleCounts?.toLocaleString('en-GB')} counts</span></Row>
          <Row label="Saturation"><span className="num">{probe.saturationCounts?.toLocaleString('en-GB')} counts</span></Row>
          <Row label="Low-signal floor"><span className="num">{probe.floorCounts?.toLocaleString('en-GB')} net counts</span></Row>
          <Row label="Gain steps"><span className="num">{(probe.gains ?? []).map((g) => `${g.code}: ×${g.nominalGain}`).join(', ')}</span></Row>
        </>
      ) : (
        <>
          <Row label="Range"><span className="num">{format(probe.rangeLowLux)} to {format(probe.rangeHighLux)}</span></Row>
          <Row label="Scale">{probe.scale === 'log10' ? 'log10 of illuminance' : 'linear'}</Row>
          <Row label="Stated accuracy"><span className="num">{probe.accuracyPercent} % of span</span></Row>
        </>
      )}
    </dl>
  );
}
