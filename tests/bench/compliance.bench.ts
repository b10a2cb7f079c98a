// Verdicts for a large survey and the PDF report: prints figures; not an asserted test.
// Run: npx tsx tests/bench/compliance.bench.ts
import { Bench } from 'tinybench';
import { judgeZones, type JudgeReading, type JudgeZone } from '../../server/modules/compliance/judge-zones';
import { renderReportPdf } from '../../server/modules/reports/report-pdf';
import type { ReportData } from '../../server/modules/reports/report-data';

let seed = 7;
const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32);

// A 10 x 4 grid of 10 m x 10 m rooms (40 zones), 500 points each (20,000 readings) and a reference every minute.
const zones: JudgeZone[] = [];
for (let i = 0; i < 10; i++) for (let j = 0; j < 4; j++) {
  zones.push({ id: zones.length + 1, name: `Room ${i}-${j}`, kind: 'room', useType: 'office_writing', planId: 1, planName: 'Floor', planeHeightM: 0.75, wallBandM: 0.5,
    polygon: [[i * 10, j * 10], [i * 10 + 10, j * 10], [i * 10 + 10, j * 10 + 10], [i * 10, j * 10 + 10]],
    target: { id: 1, name: 'Offices', emLux: 500, u0Min: 0.6, dfTargetPercent: null, source: 'EN 12464-1', confidence: 'secondary' } });
}
const readings: JudgeReading[] = [];
let t = 1_800_000_000_000;
for (const z of zones) for (let k = 0; k < 500; k++) {
  const [x0, y0] = z.polygon[0];
  const lux = 420 + rnd() * 180;
  readings.push({ id: readings.length + 1, point: `${z.name}-${k}`, xM: x0 + rnd() * 10, yM: y0 + rnd() * 10, planId: 1, role: 'task', timeMs: (t += 2000), probeId: 1, lux, uLux: lux * 0.04, luxBound: 'exact', flag: 'ok', budget: [{ name: 'calibration', uRel: 0.015 }, { name: 'quantisation', uRel: 0.001 }], coefficientSetId: 1 });
}
const start = readings[0].timeMs - 60_000;
for (let s = start; s <= t + 60_000; s += 60_000) readings.push({ id: readings.length + 1, point: 'REF', xM: null, yM: null, planId: null, role: 'reference', timeMs: s, probeId: 2, lux: 12_000 + rnd() * 500, uLux: 300, luxBound: 'exact', flag: 'ok', budget: [], coefficientSetId: 2 });

const result = judgeZones({ zones, readings, rule: 'guarded', daylightExcluded: false });
const data: ReportData = {
  organizationName: 'Bench Trust', site: { name: 'Bench site', address: null, timeZone: 'Europe/London' },
  survey: { id: 1, organizationId: 1, siteId: 1, name: 'Bench survey', startedOn: '2026-11-01', conditions: { daylightExcluded: false }, status: 'submitted', activeDecodeId: 1, reviewComment: null, submittedBy: null, submittedAt: null, signedOffBy: null, signedOffAt: null, frozen: null, gridRounding: 'next_higher', createdBy: null, createdAt: 0, installation: 'in_service', maintenanceFactor: null, mfParts: null },
  submittedByName: 'Bench', signedOffByName: null,
  compliance: { surveyId: 1, surveyName: 'Bench survey', siteId: 1, siteName: 'Bench site', siteTimeZone: 'Europe/London', startedOn: null, status: 'submitted', reviewComment: null, submittedByName: 'Bench', submittedAt: null, signedOffByName: null, signedOffAt: null, rule: 'guarded', ruleText: 'guarded', gridRule: 'grid', frozen: false, frozenAt: null, hasDaylightReference: true, installation: { state: 'in_service', maintenanceFactor: null, parts: null }, installationText: 'In service', counts: { meets: 0, falls_short: 0, inconclusive: 0, not_assessed: 0 }, zones: result.zones, unassignedPoints: 0, previous: null, warnings: [] },
  zones: result.zones.map((z) => ({ ...z, readings: readings.filter((r) => z.readingIds.includes(r.id)), wallBandReadings: [] })),
  coefficientSets: [], generatedAt: Date.now(),
};

const bench = new Bench({ time: 3000 });
bench.add('judgeZones: 40 zones, 20,000 task readings, daylight pairing', () => { judgeZones({ zones, readings, rule: 'guarded', daylightExcluded: false }); });
bench.add('renderReportPdf: 40 zone pages, 20,000 points drawn', async () => { await renderReportPdf(data); });
await bench.run();
for (const task of bench.tasks) {
  const r = task.result as { latency?: { mean: number; p99?: number }; mean?: number; p99?: number } | undefined;
  const mean = r?.latency?.mean ?? r?.mean ?? NaN;
  const p99 = r?.latency?.p99 ?? r?.p99 ?? NaN;
  console.log(`${task.name}: mean ${mean.toFixed(1)} ms, p99 ${p99.toFixed(1)} ms`);
}
const pdf = await renderReportPdf(data);
console.log(`report size: ${(pdf.length / 1024).toFixed(0)} KiB; verdicts: ${JSON.stringify(result.zones.reduce<Record<string, number>>((a, z) => ({ ...a, [z.verdict]: (a[z.verdict] ?? 0) + 1 }), {}))}`);
