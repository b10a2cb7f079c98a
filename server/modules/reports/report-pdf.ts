import PDFDocument from 'pdfkit';
import { max, min } from 'simple-statistics';
import { createRequire } from 'node:module';
import { luxToFootcandles } from '@shared/core/units';
import { COVERAGE_K } from '@shared/core/uncertainty';
import { CONFIDENCE_LABELS } from '@shared/schemas/targets';
import { CHECK_LABELS, VERDICT_LABELS, zoneVerdictCountsText, type ZoneVerdict } from '@shared/schemas/compliance';
import { labelOfUseType, ZONE_KIND_LABELS } from '@shared/schemas/zones';
import { formatDisplayNumber } from '@shared/display-number';
import { formatCalendarDay, formatDateTime as formatSiteDateTime, formatDay } from '@shared/datetime';
import { MAX_DRAWN_POINTS, type ReportData } from './report-data';
import type { PointColumns, ReadingPoint } from '../compliance/compliance-repository';

const require = createRequire(import.meta.url);
/** The shipped typeface (Instrument Sans, SIL OFL), embedded from @fontsource's WOFF files. */
const FONT_REGULAR = require.resolve('@fontsource/instrument-sans/files/instrument-sans-latin-400-normal.woff');
const FONT_BOLD = require.resolve('@fontsource/instrument-sans/files/instrument-sans-latin-600-normal.woff');
/**
 * Instrument Sans has no ±, ≤ or ≥ (checked with fontkit): those characters are set in DejaVu Sans
 * (@fontsource, SIL OFL), which has them, so the report writes the signs the screens show.
 */
const FONT_SYMBOLS = require.resolve('@fontsource/dejavu-sans/files/dejavu-sans-latin-400-normal.woff');
const FONT_SYMBOLS_BOLD = require.resolve('@fontsource/dejavu-sans/files/dejavu-sans-latin-700-normal.woff');
const SYMBOL_CHARS = /[±≤≥]+/g;
export type FontName = 'body' | 'bold';
const SYMBOL_FONT: Record<FontName, string> = { body: 'symbols', bold: 'symbols-bold' };

export type ReportUnit = 'lx' | 'fc';

/** Luxtrail's verdict palette for print: each verdict is also written out, never shown by colour alone. */
export const VERDICT_COLOURS: Record<ZoneVerdict, string> = { meets: '#2d6a4f', falls_short: '#b42318', inconclusive: '#a15c07', not_assessed: '#5b616e' };
export const INK = '#1d2330';
export const MUTED = '#5b616e';
export const RULE_LINE = '#c9ced8';

export const REPORT_CAUTIONS = [
  'This report supports decisions about lighting; it does not certify emergency lighting or replace the judgement of a qualified lighting professional.',
  'Local codes and regulations take precedence over the generic targets of the Luxtrail library. Where stairs, exits, emergency routes or machinery are concerned, have the results reviewed by a qualified professional.',
  'Targets marked "from memory" or "secondary source" have not been checked against the published standard: confirm them before relying on a verdict.',
];

export const UNCERTAINTY_STATEMENT =
  `Uncertainties are expanded uncertainties U = k * u_c with coverage factor k = ${COVERAGE_K} (about 95 % for a normal distribution), `
  + 'combined from calibration, quantisation, dark offset, temperature and, for analog probes, transmitter accuracy (JCGM 100:2008, the GUM). '
  + 'The uncertainty of a zone average keeps the calibration part undiminished, since every point shares it.';

export const A4 = { width: 595.28, height: 841.89 };
export const MARGIN = 48;
export const CONTENT_W = A4.width - 2 * MARGIN;

/** An A4 report document with Luxtrail's fonts registered; `done` resolves to the PDF once `doc.end()` is called. */
export function createReportDocument(info: { title: string; author: string }): { doc: PDFKit.PDFDocument; done: Promise<Buffer> } {
  const doc = new PDFDocument({ size: 'A4', margin: MARGIN, bufferPages: true, info: { Title: info.title, Author: info.author, Creator: 'Luxtrail' } });
  doc.registerFont('body', FONT_REGULAR);
  doc.registerFont('bold', FONT_BOLD);
  doc.registerFont('symbols', FONT_SYMBOLS);
  doc.registerFont('symbols-bold', FONT_SYMBOLS_BOLD);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  return { doc, done };
}

/** Renders the survey report as a PDF (pdfkit, vector drawings, embedded font). */
export function renderReportPdf(data: ReportData, unit: ReportUnit = 'lx', onPage?: (zonesDone: number, zones: number) => void): Promise<Buffer> {
  const { doc, done } = createReportDocument({ title: `${data.site.name}: ${data.survey.name}`, author: data.organizationName });

  const u = (lux: number | null | undefined) => formatIlluminance(lux, unit);
  const uWith = (lux: number | null, U: number | null) => (lux === null ? 'n/a' : U === null ? u(lux) : `${u(lux)} ± ${u(U)}`);
  const when = (ms: number | null) => (ms === null ? 'n/a' : formatDateTime(ms, data.site.timeZone));
  const c = data.compliance;

  // Title and status.
  doc.font('bold').fontSize(20).fillColor(INK).text('Illuminance survey report');
  doc.moveDown(0.3).font('body').fontSize(12).fillColor(MUTED).text(`${data.organizationName}`);
  doc.moveDown(0.8);
  keyValues(doc, [
    ['Site', `${data.site.name}${data.site.address ? `, ${data.site.address}` : ''}`],
    ['Survey', data.survey.name],
    ['Surveyed on', data.survey.startedOn ? formatCalendarDay(data.survey.startedOn) : 'not stated'],
    ['Status', statusLine(data, when)],
    ...signedRecord(data, when),
    ['Report generated', when(data.generatedAt)],
    ['Values in', unit === 'fc' ? 'foot-candles (1 fc = 10.7639 lx)' : 'lux'],
  ]);
  if (!c.frozen) {
    doc.moveDown(0.5).font('bold').fontSize(10).fillColor(VERDICT_COLOURS.falls_short)
      .text('Not signed off: these verdicts are provisional and change if readings, zones, targets or the decision rule change.');
  }

  section(doc, 'Conditions');
  const cond = data.survey.conditions;
  doc.font('body').fontSize(10).fillColor(INK)
    .text(cond ? `${cond.daylightExcluded ? 'Daylight excluded (electric lighting only).' : 'Daylight present during the survey.'}${cond.notes ? ` ${cond.notes}` : ''}` : 'No conditions recorded.');
  doc.text(c.hasDaylightReference ? 'An outdoor reference probe logged during the survey: daylight factors are given where the pairing in time could be trusted.' : 'No outdoor reference probe: no daylight factor is given.');

  section(doc, 'Method');
  const heights = [...new Set(data.zones.map((z) => z.planeHeightM))].sort((a, b) => a - b);
  keyValues(doc, [
    ['Working plane', heights.length ? heights.map((h) => `${h.toFixed(2)} m`).join(', ') : 'n/a'],
    ['Grid rule', c.gridRule],
    ['Wall band', 'Points closer to a room\'s outline than its wall band are shown but left out of the statistics (EN 12464-1); task areas keep theirs.'],
    ['Statistics', 'Eavg, Emin, Emax and U0 = Emin / Eavg per zone (EN 12464-1); over- and under-range points enter only as bounds.'],
    ['Decision rule', c.ruleText],
    ['Installation', c.installationText],
  ]);
  if (data.fieldConditions) fieldConditionsText(doc, data.fieldConditions, data.site.timeZone);

  section(doc, 'Summary');
  const counts = c.counts;
  doc.font('body').fontSize(10).fillColor(INK)
    .text(`${zoneVerdictCountsText(counts)}.`);
  if (c.previous) doc.text(`Compared with "${c.previous.name}", the previous signed-off survey of this site.`);
  doc.moveDown(0.5);
  table(doc, [
    { title: 'Zone', width: 112 },
    { title: 'Target Em / U0', width: 72 },
    { title: 'Eavg ± U', width: 82 },
    { title: 'Emin', width: 44 },
    { title: 'U0', width: 34 },
    { title: 'Points', width: 44 },
    { title: 'Verdict', width: 68 },
    { title: 'Change', width: CONTENT_W - 456 },
  ], data.zones.map((z) => [
    `${z.name} (${z.planName})`,
    z.targetLux === null ? 'none' : `${u(z.targetLux)} / ${z.targetU0 ?? '-'}`,
    boundSign(z.bounds.eavg) + uWith(z.eavg, z.uEavg),
    boundSign(z.bounds.emin) + u(z.emin),
    z.u0 === null ? 'n/a' : boundSign(z.bounds.u0) + formatDisplayNumber(z.u0),
    z.gridRuleApplies === false ? `${z.points} (outdoor)` : `${z.points} / ${z.requiredPoints}`,
    { text: VERDICT_LABELS[z.verdict], colour: VERDICT_COLOURS[z.verdict] },
    z.change ? `${z.change.deltaEavg === null ? 'n/a' : signed(z.change.deltaEavg, unit)}${z.change.verdictChanged ? `, was ${VERDICT_LABELS[z.change.previousVerdict].toLowerCase()}` : ''}` : '-',
  ]));
  if (data.zones.some((z) => z.bounds.eavg || z.bounds.emin || z.bounds.u0)) {
    doc.moveDown(0.3).fontSize(8.5).fillColor(MUTED);
    textWithSymbols(doc, 'body', BOUND_FOOTNOTE, null, { width: CONTENT_W });
  }
  // Notes on measurement conditions are printed with the method (above), not twice.
  const notes = c.warnings.filter((w) => !data.fieldConditions?.notes.includes(w));
  if (notes.length) {
    doc.moveDown(0.5).font('bold').fontSize(9).fillColor(INK).text('Notes');
    doc.font('body').fontSize(9).fillColor(MUTED);
    for (const w of notes) textWithSymbols(doc, 'body', `- ${w}`, null, { width: CONTENT_W });
  }
  doc.moveDown(0.5).fontSize(8.5).fillColor(MUTED);
  textWithSymbols(doc, 'body', `Decision rule: ${c.ruleText}`, null, { width: CONTENT_W });

  // A page per zone.
  for (const [zoneIndex, z] of data.zones.entries()) {
    onPage?.(zoneIndex, data.zones.length);
    doc.addPage();
    doc.font('bold').fontSize(15).fillColor(INK).text(z.name);
    doc.font('body').fontSize(10).fillColor(MUTED).text(`${z.planName} - ${ZONE_KIND_LABELS[z.kind]} - ${labelOfUseType(z.useType)} - working plane ${z.planeHeightM.toFixed(2)} m`);
    doc.moveDown(0.4).font('bold').fontSize(12).fillColor(VERDICT_COLOURS[z.verdict]).text(VERDICT_LABELS[z.verdict]);
    doc.moveDown(0.3);
    drawZonePlan(doc, z, u);
    keyValues(doc, [
      ['Target', z.targetName ? `${z.targetName}: Em ${u(z.targetLux)}${z.targetU0 !== null ? `, U0 ${z.targetU0}` : ''}${z.dfTargetPercent ? `, DF ${z.dfTargetPercent} %` : ''}` : 'none in the library'],
      ...(z.requiredLux != null ? [['Required / modified', `${u(z.requiredLux)} / ${z.modifiedLux != null ? u(z.modifiedLux) : 'not given'}`] as [string, string]] : []),
      ...(z.design ? [['Value judged', z.design.explanation] as [string, string]] : []),
      ...(z.limitLux != null ? [['Compared with', `${u(z.limitLux)} (${c.installation.state === 'new' ? `new installation: Em / MF ${c.installation.maintenanceFactor}` : 'in service: Em'})`] as [string, string]] : []),
      ...(z.info && (z.info.ra !== null || z.info.rugl !== null) ? [['Ra / RUGL', `${z.info.ra ?? '-'} / ${z.info.rugl ?? '-'} (for information: ${z.info.note})`] as [string, string]] : []),
      ...(z.modelling ? [['Modelling Ez / Eh', `${z.modelling.ratio.toFixed(2)} (${z.modelling.withinRecommendation ? 'within' : 'outside'} 0.30 to 0.60, ${z.modelling.source}; informative)`] as [string, string]] : []),
      ['Source', z.targetSource ? `${z.targetSource} (${CONFIDENCE_LABELS[z.targetConfidence!]})` : 'n/a'],
      ['Eavg', boundSign(z.bounds.eavg) + uWith(z.eavg, z.uEavg) + boundNote(z.bounds.eavg)],
      ['Emin / Emax', `${boundSign(z.bounds.emin)}${u(z.emin)}${boundNote(z.bounds.emin)} / ${u(z.emax)}`],
      ['U0 = Emin / Eavg', z.u0 === null ? 'n/a' : boundSign(z.bounds.u0) + formatDisplayNumber(z.u0) + boundNote(z.bounds.u0)],
      ['Points', z.gridRuleApplies === false
        ? `${z.points} used; the indoor grid rule is not applied to outdoor areas`
        : `${z.points} used, ${z.requiredPoints} required by the grid rule, ${z.wallBandPoints} in the wall band`],
      ...(z.dfAvg !== undefined ? [['Daylight factor', `${z.dfAvg.toFixed(1)} % average${z.dfWarning ? ` (${z.dfWarning})` : ''}`] as [string, string]] : []),
      ...(z.change ? [['Previous survey', `Eavg ${u(z.change.previousEavg)}, ${VERDICT_LABELS[z.change.previousVerdict].toLowerCase()}`] as [string, string]] : []),
    ]);
    doc.moveDown(0.4).font('bold').fontSize(9.5).fillColor(INK).text('Why');
    doc.font('body').fontSize(9).fillColor(INK);
    for (const r of z.reasons) textWithSymbols(doc, 'body', `- ${r}`, null, { width: CONTENT_W });
    if (z.checks?.length) {
      doc.moveDown(0.4).font('bold').fontSize(9.5).fillColor(INK).text('Further checks (each judged on its own)');
      doc.moveDown(0.2);
      table(doc, [
        { title: 'Check', width: 120 },
        { title: 'Em (compared with)', width: 100 },
        { title: 'Eavg ± U', width: 90 },
        { title: 'U0 (min)', width: 60 },
        { title: 'Points', width: 40 },
        { title: 'Verdict', width: CONTENT_W - 410 },
      ], z.checks.map((k) => [
        CHECK_LABELS[k.kind],
        k.targetLux === null ? 'not given' : `${u(k.targetLux)}${k.limitLux !== null && k.limitLux !== k.targetLux ? ` (${u(k.limitLux)})` : ''}`,
        boundSign(k.bounds.eavg) + uWith(k.eavg, k.uEavg),
        `${k.u0 === null ? 'n/a' : boundSign(k.bounds.u0) + formatDisplayNumber(k.u0)}${k.u0Min !== null ? ` (${k.u0Min})` : ''}`,
        String(k.points),
        { text: VERDICT_LABELS[k.verdict], colour: VERDICT_COLOURS[k.verdict] },
      ]));
      doc.font('body').fontSize(8.5).fillColor(MUTED);
      for (const k of z.checks) textWithSymbols(doc, 'body', `${CHECK_LABELS[k.kind]}: ${k.reasons.join(' ')} Source: ${k.source} (${CONFIDENCE_LABELS[k.confidence]}).`, null, { width: CONTENT_W });
    }
    doc.moveDown(0.3).fontSize(8.5).fillColor(MUTED);
    textWithSymbols(doc, 'body', `Decision rule: ${c.ruleText}`, null, { width: CONTENT_W });
  }

  // Probes, calibration, uncertainty, cautions.
  doc.addPage();
  section(doc, 'Probes and calibration', true);
  if (data.coefficientSets.length === 0) doc.font('body').fontSize(10).fillColor(INK).text('No decoded readings.');
  else {
    table(doc, [
      { title: 'Probe', width: 70 },
      { title: 'Kind', width: 64 },
      { title: 'Set', width: 34 },
      { title: 'Certificate', width: 112 },
      { title: 'Effective from', width: 80 },
      { title: 'Due', width: 80 },
      { title: 'Readings', width: CONTENT_W - 440 },
    ], data.coefficientSets.map((s) => [
      s.probeSerial, PROBE_KIND_LABELS[s.probeKind as keyof typeof PROBE_KIND_LABELS] ?? s.probeKind, `v${s.version}`, s.certificateNumber, formatDay(s.effectiveFrom, data.site.timeZone),
      { text: formatDay(s.dueDate, data.site.timeZone) + (surveyTime(data) > s.dueDate ? ' (lapsed)' : ''), colour: surveyTime(data) > s.dueDate ? VERDICT_COLOURS.falls_short : INK },
      String(s.readings),
    ]));
    doc.moveDown(0.5).font('bold').fontSize(9.5).fillColor(INK).text('Coefficient sets');
    doc.font('body').fontSize(8.5).fillColor(INK);
    for (const set of data.coefficientSets) textWithSymbols(doc, 'body', describeCoefficientSet(set), null, { width: CONTENT_W });
  }
  section(doc, 'Uncertainty');
  doc.font('body').fontSize(10).fillColor(INK).text(UNCERTAINTY_STATEMENT, { width: CONTENT_W });
  section(doc, 'Cautions');
  doc.font('body').fontSize(10).fillColor(INK);
  for (const caution of REPORT_CAUTIONS) doc.text(`- ${caution}`, { width: CONTENT_W }).moveDown(0.2);

  if (data.photos?.length || data.zoneNotes?.length) fieldAppendix(doc, data.photos ?? [], data.zoneNotes ?? [], data.site.timeZone);

  // Footer on every page.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    // Writing inside the bottom margin would make pdfkit start a new page: lift the margin while writing.
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.font('body').fontSize(8).fillColor(MUTED)
      .text(`${data.site.name} - ${data.survey.name} - page ${i + 1} of ${range.count}`, MARGIN, A4.height - MARGIN + 14, { width: CONTENT_W, align: 'center', lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  return done;
}

function surveyTime(data: ReportData): number {
  let latest = -Infinity;
  for (const z of data.zones) {
    for (const r of z.readings) if (r.timeMs > latest) latest = r.timeMs;
    if (z.columns && z.columns.used.latestMs > latest) latest = z.columns.used.latestMs;
  }
  return latest === -Infinity ? data.generatedAt : latest;
}

/** The sign-off as recorded: who, when and the signer's comment (on the first page). */
function signedRecord(data: ReportData, when: (ms: number | null) => string): [string, string][] {
  const s = data.survey;
  if (s.status !== 'signed_off') return [];
  return [
    ['Signed off by', data.signedOffByName ?? 'unknown'],
    ['Signed off on', when(s.signedOffAt)],
    ['Sign-off comment', s.reviewComment?.trim() ? s.reviewComment : 'none given'],
    ['Submitted by', `${data.submittedByName ?? 'unknown'} on ${when(s.submittedAt)}`],
  ];
}

function statusLine(data: ReportData, when: (ms: number | null) => string): string {
  const s = data.survey;
  if (s.status === 'signed_off') return `Signed off by ${data.signedOffByName ?? 'unknown'} on ${when(s.signedOffAt)}`;
  if (s.status === 'submitted') return `Submitted by ${data.submittedByName ?? 'unknown'} on ${when(s.submittedAt)}, awaiting sign-off`;
  if (s.status === 'returned') return `Returned for changes${s.reviewComment ? `: ${s.reviewComment}` : ''}`;
  return 'Draft';
}

/** A figure that is only a bound is written with its direction: ≥ (at least) or ≤ (at most). */
const boundSign = (b: string | null) => (b === 'lower' ? '≥ ' : b === 'upper' ? '≤ ' : b === 'indeterminate' ? 'indeterminate: ' : '');
export const BOUND_FOOTNOTE = '≥ marks a lower bound (the true value is at least the figure: an over-range point entered it); ≤ marks an upper bound (at most: an under-range point entered it). "Indeterminate" means bounds pointed both ways.';
const boundNote = (b: string | null) => (b === 'lower' ? ' (a lower bound)' : b === 'upper' ? ' (an upper bound)' : b === 'indeterminate' ? ' (indeterminate)' : '');

const PROBE_KIND_LABELS = { counts: 'Counting probe', current_4_20: '4-20 mA transmitter', voltage_0_10: '0-10 V transmitter' } as const;

/** Each probe kind described in its own terms: a counting probe by its gain codes, a transmitter by its signal range. */
export function describeCoefficientSet(s: ReportData['coefficientSets'][number]): string {
  const head = `${s.probeSerial} v${s.version}, ${PROBE_KIND_LABELS[s.probeKind as keyof typeof PROBE_KIND_LABELS] ?? s.probeKind}`;
  const uCal = (uRel: number) => `calibration uncertainty ${formatDisplayNumber(uRel * 100)} % (k = 1)`;
  if (s.probeKind === 'counts') {
    const gains = s.gains.map((g) => `gain code ${g.code}: dark ${g.darkCounts} counts, ${g.luxPerCount} lx per count, ${uCal(g.uRel)}`).join('; ');
    return `${head}: coefficients measured at an integration time of ${s.tRefMs} ms and ${s.tCalC} °C, temperature coefficient ${s.alphaPerK} per K. ${gains}.`;
  }
  const signal = s.probeKind === 'current_4_20' ? ['4 mA', '20 mA'] : ['0 V', '10 V'];
  const range = s.analog
    ? `${signal[0]} = ${s.analog.rangeLowLux} lx, ${signal[1]} = ${s.analog.rangeHighLux} lx (${s.analog.scale === 'log10' ? 'logarithmic: log10 of lux is linear in the signal' : 'linear'}), transmitter accuracy ± ${s.analog.accuracyPercent} % of span`
    : 'signal range not recorded with this sign-off';
  const uRel = s.gains[0]?.uRel;
  return `${head}: ${range}${uRel !== undefined ? `, ${uCal(uRel)}` : ''}. Counts, gain codes, integration time and temperature correction do not apply to a transmitter.`;
}

export function formatIlluminance(lux: number | null | undefined, unit: ReportUnit): string {
  if (lux === null || lux === undefined || !Number.isFinite(lux)) return 'n/a';
  return `${formatDisplayNumber(unit === 'fc' ? luxToFootcandles(lux) : lux)} ${unit}`;
}

function signed(lux: number, unit: ReportUnit): string {
  return `${lux >= 0 ? '+' : '-'}${formatIlluminance(Math.abs(lux), unit)}`;
}

/** The report's date and time: shared/datetime's one format, in the site's zone, labelled. */
export function formatDateTime(ms: number, timeZone: string): string {
  return formatSiteDateTime(ms, timeZone);
}

/** The report's date: shared/datetime's one format, in the site's zone. */
export function formatDate(ms: number, timeZone: string): string {
  return formatDay(ms, timeZone);
}

const SKY_TEXT = { overcast: 'overcast', clear: 'clear sky', night: 'night' } as const;

/** Each field visit's conditions, the warm-up time used, and the readings the conditions put in doubt. */
function fieldConditionsText(doc: PDFKit.PDFDocument, f: NonNullable<ReportData['fieldConditions']>, timeZone: string) {
  doc.moveDown(0.5).font('bold').fontSize(9.5).fillColor(INK).text('Measurement conditions', MARGIN);
  doc.font('body').fontSize(9).fillColor(INK);
  for (const s of f.sessions) {
    const parts = [
      `measured by ${s.measuredBy}`,
      s.lightsOnAt ? `lights on at ${formatDateTime(Date.parse(s.lightsOnAt), timeZone)}` : 'switch-on time not recorded',
      s.supplyVoltageV !== null ? `supply ${s.supplyVoltageV} V` : null,
      s.ambientTempC !== null ? `ambient ${s.ambientTempC} °C` : null,
      s.sky ? SKY_TEXT[s.sky] : null,
      s.blinds ? `blinds ${s.blinds}` : null,
      s.lampBurnInHours !== null ? `lamps burnt in ${s.lampBurnInHours} h` : null,
      s.daylightExcluded ? 'daylight excluded' : 'daylight present',
    ].filter(Boolean);
    doc.text(`- Visit from ${formatDateTime(Date.parse(s.startedAt), timeZone)}: ${parts.join('; ')}.${s.note ? ` ${s.note}` : ''}`, { width: CONTENT_W });
  }
  doc.text(`Readings are expected at least ${f.warmUpMinutes} min after the lights are switched on (warm-up time, common practice for discharge lamps).`, { width: CONTENT_W });
  for (const n of f.notes) textWithSymbols(doc, 'body', `- ${n}`, null, { width: CONTENT_W });
}

/**
 * Photos taken in the field, two to a row, each with its zone, point, time (site zone) and note;
 * then the notes written on whole zones.
 */
function fieldAppendix(doc: PDFKit.PDFDocument, photos: NonNullable<ReportData['photos']>, zoneNotes: NonNullable<ReportData['zoneNotes']>, timeZone: string) {
  doc.addPage();
  section(doc, 'Appendix: photos and notes from the field', true);
  const gap = 16;
  const cellW = (CONTENT_W - gap) / 2;
  const imageH = 190;
  const captionH = 36;
  let col = 0;
  let rowY = doc.y;
  for (const p of photos) {
    if (col === 0 && rowY + imageH + captionH > A4.height - MARGIN) { doc.addPage(); rowY = MARGIN; }
    const x = MARGIN + col * (cellW + gap);
    doc.image(p.filePath, x, rowY, { fit: [cellW, imageH], align: 'center', valign: 'center' });
    const caption = [p.zoneName ?? 'No zone', p.point ? `point ${p.point}` : null, formatDateTime(p.takenAt, timeZone)].filter(Boolean).join(' · ');
    doc.font('bold').fontSize(8.5).fillColor(INK).text(caption, x, rowY + imageH + 4, { width: cellW, lineBreak: true, height: 12, ellipsis: true });
    if (p.note) doc.font('body').fontSize(8).fillColor(MUTED).text(p.note, x, rowY + imageH + 16, { width: cellW, height: captionH - 16, ellipsis: true });
    col = 1 - col;
    if (col === 0) rowY += imageH + captionH + 8;
  }
  doc.x = MARGIN;
  doc.y = col === 0 ? rowY : rowY + imageH + captionH + 8;
  if (zoneNotes.length === 0) return;
  if (photos.length) section(doc, 'Notes on zones');
  for (const n of zoneNotes) {
    if (doc.y > A4.height - MARGIN - 40) doc.addPage();
    doc.font('bold').fontSize(9).fillColor(INK).text(`${n.zoneName} · ${formatDateTime(n.recordedAt, timeZone)}`, MARGIN, doc.y, { width: CONTENT_W });
    textWithSymbols(doc, 'body', n.note, null, { width: CONTENT_W });
    doc.moveDown(0.4);
  }
}

export function section(doc: PDFKit.PDFDocument, title: string, first = false) {
  if (!first) doc.moveDown(1);
  if (doc.y > A4.height - MARGIN - 80) doc.addPage();
  doc.font('bold').fontSize(13).fillColor(INK).text(title, MARGIN);
  const y = doc.y + 2;
  doc.moveTo(MARGIN, y).lineTo(MARGIN + CONTENT_W, y).lineWidth(0.5).strokeColor(RULE_LINE).stroke();
  doc.moveDown(0.4);
}

/** Text in `font` (at a position, or flowing on), with any ±, ≤ or ≥ set in the symbol font of the same weight as continued runs. */
export function textWithSymbols(doc: PDFKit.PDFDocument, font: FontName, text: string, at: { x: number; y: number } | null, options: PDFKit.Mixins.TextOptions = {}) {
  const runs: { text: string; symbol: boolean }[] = [];
  let from = 0;
  for (const m of text.matchAll(SYMBOL_CHARS)) {
    if (m.index > from) runs.push({ text: text.slice(from, m.index), symbol: false });
    runs.push({ text: m[0], symbol: true });
    from = m.index + m[0].length;
  }
  if (from < text.length) runs.push({ text: text.slice(from), symbol: false });
  if (runs.length <= 1 && !runs[0]?.symbol) {
    if (at) doc.font(font).text(text, at.x, at.y, options);
    else doc.font(font).text(text, options);
    return;
  }
  runs.forEach((run, i) => {
    doc.font(run.symbol ? SYMBOL_FONT[font] : font);
    const continued = i < runs.length - 1;
    if (i > 0) doc.text(run.text, { continued });
    else if (at) doc.text(run.text, at.x, at.y, { ...options, continued });
    else doc.text(run.text, { ...options, continued });
  });
  doc.font(font);
}

export function keyValues(doc: PDFKit.PDFDocument, rows: [string, string][]) {
  const keyW = 120;
  for (const [k, v] of rows) {
    const y = doc.y;
    const h = Math.max(doc.font('body').fontSize(10).heightOfString(v, { width: CONTENT_W - keyW }), 12);
    if (y + h > A4.height - MARGIN) doc.addPage();
    const top = doc.y;
    doc.font('bold').fontSize(10).fillColor(MUTED).text(k, MARGIN, top, { width: keyW - 8 });
    doc.fontSize(10).fillColor(INK);
    textWithSymbols(doc, 'body', v, { x: MARGIN + keyW, y: top }, { width: CONTENT_W - keyW });
    doc.y = Math.max(doc.y, top + h) + 3;
  }
  doc.x = MARGIN;
}

export type Cell = string | { text: string; colour: string };

export function table(doc: PDFKit.PDFDocument, columns: { title: string; width: number }[], rows: Cell[][]) {
  const pad = 3;
  const drawRow = (cells: Cell[], header: boolean) => {
    doc.font(header ? 'bold' : 'body').fontSize(8.5);
    const heights = cells.map((cell, i) => doc.heightOfString(typeof cell === 'string' ? cell : cell.text, { width: columns[i].width - 2 * pad }));
    const h = max(heights) + 2 * pad;
    if (doc.y + h > A4.height - MARGIN - 10) {
      doc.addPage();
      if (!header) drawRow(columns.map((col) => col.title), true);
    }
    const top = doc.y;
    let x = MARGIN;
    cells.forEach((cell, i) => {
      const text = typeof cell === 'string' ? cell : cell.text;
      doc.fillColor(header ? MUTED : typeof cell === 'string' ? INK : cell.colour);
      textWithSymbols(doc, header ? 'bold' : 'body', text, { x: x + pad, y: top + pad }, { width: columns[i].width - 2 * pad });
      x += columns[i].width;
    });
    doc.moveTo(MARGIN, top + h).lineTo(MARGIN + CONTENT_W, top + h).lineWidth(0.4).strokeColor(RULE_LINE).stroke();
    doc.x = MARGIN;
    doc.y = top + h;
  };
  drawRow(columns.map((col) => col.title), true);
  for (const r of rows) drawRow(r, false);
  doc.moveDown(0.3);
}

/** The zone's outline and its points, drawn to scale as vector graphics, with a scale bar. */
function drawZonePlan(doc: PDFKit.PDFDocument, z: ReportData['zones'][number], u: (lux: number | null) => string) {
  const boxW = CONTENT_W;
  const boxH = 250;
  const top = doc.y;
  const xs = z.polygon.map((p) => p[0]);
  const ys = z.polygon.map((p) => p[1]);
  const minX = min(xs), maxX = max(xs), minY = min(ys), maxY = max(ys);
  const pad = 16;
  const s = Math.min((boxW - 2 * pad) / Math.max(maxX - minX, 0.1), (boxH - 2 * pad - 14) / Math.max(maxY - minY, 0.1));
  const ox = MARGIN + pad + ((boxW - 2 * pad) - (maxX - minX) * s) / 2;
  const oy = top + pad;
  const tx = (x: number) => ox + (x - minX) * s;
  const ty = (y: number) => oy + (maxY - y) * s;

  doc.rect(MARGIN, top, boxW, boxH).lineWidth(0.4).strokeColor(RULE_LINE).stroke();
  doc.polygon(...z.polygon.map((p) => [tx(p[0]), ty(p[1])] as [number, number])).lineWidth(1.2).strokeColor(INK).stroke();

  const target = z.targetLux;
  const points = z.columns ? z.columns.used.count + z.columns.band.count : z.readings.length + z.wallBandReadings.length;
  const label = points <= 80;
  const dots = points > MAX_DRAWN_POINTS ? thinnedDots(z.columns ?? { used: columnsOf(z.readings), band: columnsOf(z.wallBandReadings) }, tx, ty, target) : null;
  if (dots) {
    for (const d of dots.used) doc.circle(d.x, d.y, 2.6).fillColor(d.colour).fill();
    for (const d of dots.band) doc.circle(d.x, d.y, 2.6).lineWidth(0.7).strokeColor(MUTED).stroke();
  } else {
    for (const r of z.readings) {
      if (r.xM === null || r.yM === null) continue;
      const below = target !== null && r.lux !== null && r.lux < target;
      const colour = r.lux === null ? MUTED : below ? VERDICT_COLOURS.falls_short : VERDICT_COLOURS.meets;
      const x = tx(r.xM), y = ty(r.yM);
      // A bound is drawn as a triangle pointing the way the true value lies: up for "at least", down for "at most".
      if (r.luxBound === 'lower') doc.polygon([x, y - 3.4], [x + 3.2, y + 2.4], [x - 3.2, y + 2.4]).lineWidth(0.9).strokeColor(colour).stroke();
      else if (r.luxBound === 'upper') doc.polygon([x, y + 3.4], [x + 3.2, y - 2.4], [x - 3.2, y - 2.4]).lineWidth(0.9).strokeColor(colour).stroke();
      else doc.circle(x, y, 2.6).fillColor(colour).fill();
      if (label) {
        doc.fontSize(5.5).fillColor(INK);
        textWithSymbols(doc, 'body', r.lux === null ? 'fault' : boundSign(r.luxBound === 'exact' ? null : r.luxBound) + u(r.lux).replace(/ (lx|fc)$/, ''), { x: x + 3.5, y: y - 3 }, { lineBreak: false });
      }
    }
    for (const r of z.wallBandReadings) {
      if (r.xM === null || r.yM === null) continue;
      doc.circle(tx(r.xM), ty(r.yM), 2.6).lineWidth(0.7).strokeColor(MUTED).stroke();
    }
  }

  // Scale bar: a round length near a fifth of the drawing.
  const niceM = [0.5, 1, 2, 5, 10, 20, 50, 100].find((m) => m * s >= (boxW - 2 * pad) / 6) ?? 100;
  const barY = top + boxH - 10;
  doc.moveTo(MARGIN + pad, barY).lineTo(MARGIN + pad + niceM * s, barY).lineWidth(1.5).strokeColor(INK).stroke();
  doc.font('body').fontSize(7).fillColor(INK).text(`${niceM} m`, MARGIN + pad + niceM * s + 4, barY - 4, { lineBreak: false });
  doc.font('body').fontSize(7).fillColor(MUTED).text(
    `${target !== null ? 'Filled green: at or above Em; filled red: below Em' : 'Filled: points used'}; open triangle up: over range (at least); down: under range (at most); hollow circle: wall band (left out)${target !== null ? '; grey: fault' : ''}.`,
    MARGIN + boxW / 4, barY - 4, { width: boxW * 3 / 4 - 8, align: 'right', lineBreak: false },
  );
  if (dots) {
    doc.font('body').fontSize(7).fillColor(MUTED).text(
      `${points.toLocaleString('en-GB')} points drawn as ${(dots.used.length + dots.band.length).toLocaleString('en-GB')} dots: each dot stands for the points under it, red when any of them is below Em.`,
      MARGIN + 4, top + 4, { width: boxW - 8, lineBreak: false },
    );
  }
  doc.x = MARGIN;
  doc.y = top + boxH + 8;
}

/** ReadingPoints as columns (NaN: no position or value). */
function columnsOf(points: readonly ReadingPoint[]): PointColumns {
  const c: PointColumns = { count: points.length, xM: new Float64Array(points.length), yM: new Float64Array(points.length), lux: new Float64Array(points.length), latestMs: -Infinity };
  points.forEach((r, i) => {
    c.xM[i] = r.xM ?? Number.NaN;
    c.yM[i] = r.yM ?? Number.NaN;
    c.lux[i] = r.lux ?? Number.NaN;
    if (r.timeMs > c.latestMs) c.latestMs = r.timeMs;
  });
  return c;
}

/**
 * One dot per 5.2 pt cell of the drawing holding points: red if any point in it is below Em,
 * grey if all are faults, else green; wall-band cells hollow. Bounds the drawing whatever the
 * zone's size (at most about 100 x 50 cells), and hides no shortfall.
 */
function thinnedDots(z: { used: PointColumns; band: PointColumns }, tx: (x: number) => number, ty: (y: number) => number, target: number | null) {
  const cell = 5.2;
  const used = new Map<string, { x: number; y: number; below: boolean; value: boolean }>();
  const u = z.used;
  for (let i = 0; i < u.count; i++) {
    if (Number.isNaN(u.xM[i]) || Number.isNaN(u.yM[i])) continue;
    const x = tx(u.xM[i]), y = ty(u.yM[i]);
    const key = `${Math.floor(x / cell)},${Math.floor(y / cell)}`;
    const d = used.get(key) ?? { x: (Math.floor(x / cell) + 0.5) * cell, y: (Math.floor(y / cell) + 0.5) * cell, below: false, value: false };
    const lux = u.lux[i];
    if (!Number.isNaN(lux)) d.value = true;
    if (!Number.isNaN(lux) && target !== null && lux < target) d.below = true;
    used.set(key, d);
  }
  const band = new Map<string, { x: number; y: number }>();
  const b = z.band;
  for (let i = 0; i < b.count; i++) {
    if (Number.isNaN(b.xM[i]) || Number.isNaN(b.yM[i])) continue;
    const x = tx(b.xM[i]), y = ty(b.yM[i]);
    const key = `${Math.floor(x / cell)},${Math.floor(y / cell)}`;
    if (!band.has(key) && !used.has(key)) band.set(key, { x: (Math.floor(x / cell) + 0.5) * cell, y: (Math.floor(y / cell) + 0.5) * cell });
  }
  return {
    used: [...used.values()].map((d) => ({ x: d.x, y: d.y, colour: !d.value ? MUTED : d.below ? VERDICT_COLOURS.falls_short : VERDICT_COLOURS.meets })),
    band: [...band.values()],
  };
}
