import { asc, eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { plans } from '../../db/schema/plans';
import { organizations } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import { luxToFootcandles } from '@shared/core/units';
import { passName, type EmergencyPass } from '@shared/core/emergency';
import { ELEMENT_KIND_LABELS, SYSTEM_TYPE_LABELS, type ElementVerdict, type EmergencySurvey, type SiteLogbook } from '@shared/schemas/emergency';
import { planExtent } from '../plans/plans-service';
import {
  A4, CONTENT_W, createReportDocument, formatDateTime, INK, keyValues, MARGIN, MUTED, RULE_LINE, section, table, textWithSymbols,
  UNCERTAINTY_STATEMENT, VERDICT_COLOURS, type ReportUnit,
} from '../reports/report-pdf';
import { reportFilename } from '../reports/reports-service';
import { frozenEmergencyOf, getEmergencySurveyRow, judgeEmergencySurvey, presentJudged } from './emergency-surveys-service';
import { findSurveyInOrganization, type SurveyRow } from '../surveys/surveys-service';
import { siteLogbook } from './logbook-service';

const VERDICT_WORDS = { meets: 'Meets', falls_short: 'Falls short', inconclusive: 'Inconclusive', not_judged: 'Not judged' } as const;
const COLOUR = { ...VERDICT_COLOURS, not_judged: VERDICT_COLOURS.not_assessed } as const;
/** Entries of the logbook the report lists. */
export const REPORT_LOGBOOK_ENTRIES = 10;

/** Illuminance with four significant figures and the unit: at emergency levels the second decimal decides. */
export function emergencyIlluminance(lux: number | null | undefined, unit: ReportUnit): string {
  if (lux === null || lux === undefined || !Number.isFinite(lux)) return 'n/a';
  const v = unit === 'fc' ? luxToFootcandles(lux) : lux;
  return `${Math.abs(v) >= 1000 ? v.toFixed(0) : v.toPrecision(4)} ${unit}`;
}

const boundWord = (b: string | null) => (b === 'lower' ? ' (lower bound)' : b === 'upper' ? ' (upper bound)' : b === 'indeterminate' ? ' (indeterminate)' : '');

/** The emergency survey report (the same pdfkit pipeline and fonts as the survey report). */
export async function emergencyReportPdf(deps: Deps, user: SessionUser, surveyId: number, unit: ReportUnit) {
  const s = judgeEmergencySurvey(deps.db, user, surveyId);
  // A signed-off survey reports the logbook as it stood at sign-off.
  const frozen = frozenEmergencyOf(getEmergencySurveyRow(deps.db, user, surveyId).survey);
  return renderEmergencyReportFile(deps, user.organizationId, s, frozen?.logbook ?? reportLogbook(deps, user, s.siteId), unit);
}

/** The attachment kind a queued message names to have a signed-off emergency survey's report built at delivery. */
export const EMERGENCY_REPORT_ATTACHMENT = 'emergency_report';

/** A pending attachment: the signed-off emergency survey's report, built from its frozen record when the mail is delivered. */
export function emergencyReportAttachment(survey: Pick<SurveyRow, 'id' | 'name' | 'organizationId'>, unit: ReportUnit = 'lx') {
  return { kind: EMERGENCY_REPORT_ATTACHMENT, filename: reportFilename(survey, 'pdf', 'emergency-report'), params: { surveyId: survey.id, organizationId: survey.organizationId, unit } };
}

export function registerEmergencyReportAttachment(deps: Deps) {
  deps.mailer.attachmentBuilder(EMERGENCY_REPORT_ATTACHMENT, async (params) => {
    const { surveyId, organizationId, unit } = params as { surveyId: number; organizationId: number; unit: ReportUnit };
    const row = findSurveyInOrganization(deps.db, organizationId, surveyId);
    const frozen = row ? frozenEmergencyOf(row) : null;
    if (!row || !frozen) throw new Error(`Survey ${surveyId} is not a signed-off emergency survey; its report cannot be attached`);
    return renderEmergencyReportFile(deps, organizationId, presentJudged(deps.db, row, frozen.judged, false), frozen.logbook, unit);
  });
}

/** The logbook part a report shows (its latest entries). */
export function reportLogbook(deps: Deps, user: SessionUser, siteId: number): SiteLogbook {
  return siteLogbook(deps, user, siteId, REPORT_LOGBOOK_ENTRIES);
}

/** The report of an emergency survey answer as given (live, or a signed-off survey's frozen one). */
export async function renderEmergencyReportFile(deps: Deps, organizationId: number, s: EmergencySurvey, logbook: SiteLogbook, unit: ReportUnit) {
  const org = deps.db.select().from(organizations).where(eq(organizations.id, organizationId)).get()!;
  const sitePlans = deps.db.select().from(plans).where(eq(plans.siteId, s.siteId)).orderBy(asc(plans.id)).all();
  const content = await renderEmergencyReport(s, logbook, sitePlans.map((p) => ({ id: p.id, name: p.name, extent: planExtent(p) })), org.name, deps.clock.now(), unit);
  return { filename: reportFilename({ id: s.surveyId, name: s.name }, 'pdf', 'emergency-report'), contentType: 'application/pdf', content };
}

type PlanInfo = { id: number; name: string; extent: { widthM: number; heightM: number } | null };

export function renderEmergencyReport(s: EmergencySurvey, logbook: SiteLogbook, sitePlans: PlanInfo[], organizationName: string, generatedAt: number, unit: ReportUnit): Promise<Buffer> {
  const { doc, done } = createReportDocument({ title: `${s.siteName}: ${s.name} (emergency lighting)`, author: organizationName });
  const u = (lux: number | null) => emergencyIlluminance(lux, unit);
  const when = (iso: string | null) => (iso ? formatDateTime(Date.parse(iso), s.siteTimeZone) : 'n/a');
  const c = s.conditions;

  doc.font('bold').fontSize(20).fillColor(INK).text('Emergency lighting survey report');
  doc.moveDown(0.3).font('body').fontSize(12).fillColor(MUTED).text(organizationName);
  doc.moveDown(0.6);
  cautionBox(doc, s.cautions.slice(0, 3));
  keyValues(doc, [
    ['Site', s.siteName],
    ['Survey', `${s.name} (${s.status.replace('_', ' ')})`],
    ...(s.frozenAt ? [['Signed off', `${formatDateTime(Date.parse(s.frozenAt), s.siteTimeZone)}: verdicts, criteria and logbook as they stood then`] as [string, string]] : []),
    ['Surveyed on', s.startedOn ?? 'not stated'],
    ['Overall', VERDICT_WORDS[s.verdict]],
    ['Report generated', formatDateTime(generatedAt, s.siteTimeZone)],
    ['Values in', unit === 'fc' ? 'foot-candles (1 fc = 10.763910417 lx exactly)' : 'lux'],
  ]);

  section(doc, 'Criteria and decision rule');
  keyValues(doc, [
    ['Criteria set', `${s.criteriaSet.name}${s.criteriaSet.builtIn ? '' : ' (the organisation\'s own)'}`],
    ['Source', s.criteriaSet.source],
    ['Passes required', s.criteriaSet.requiredPasses.map(passName).join('; ') || 'none'],
    ['Decision rule', s.ruleText],
    ['Uncertainty', `${UNCERTAINTY_STATEMENT} At emergency levels the dark offset and quantisation dominate the budget; an under-range reading is an upper bound and can never show compliance.`],
  ]);
  for (const n of s.criteriaSet.notes) doc.font('body').fontSize(9).fillColor(MUTED).text(`• ${n}`);

  section(doc, 'Conditions and passes');
  keyValues(doc, [
    ['System', SYSTEM_TYPE_LABELS[c.systemType]],
    ['Rated duration', `${c.ratedDurationMin} min`],
    ['Mains failed at', when(c.mainsOffAt)],
    ['Normal lighting', c.normalLightingOff ? 'off' : 'ON: readings include it'],
    ['Daylight', c.daylightExcluded ? 'excluded' : 'PRESENT: readings include it'],
    ...(c.notes ? [['Notes', c.notes] as [string, string]] : []),
  ]);
  table(doc, [{ title: 'Pass', width: 170 }, { title: 'Readings', width: 60 }, { title: 'Taken (from the mains failing)', width: CONTENT_W - 230 }],
    s.passes.map((p) => [passName(p.pass), String(p.readings), p.readings ? `${when(p.firstAt)} to ${when(p.lastAt)} (${p.fromMin?.toFixed(1)} to ${p.toMin?.toFixed(1)} min)` : 'not measured']));
  for (const w of s.warnings) { doc.fillColor(VERDICT_COLOURS.inconclusive).fontSize(9); textWithSymbols(doc, 'body', `! ${w}`, null); }

  section(doc, 'Summary');
  table(doc, [
    { title: 'Element', width: 130 }, { title: 'Kind', width: 80 }, { title: 'Plan', width: 70 }, { title: 'Worst point ± U (k = 2)', width: 130 }, { title: 'Verdict', width: CONTENT_W - 410 },
  ], s.elements.map((e) => [
    `${e.element.code} ${e.element.name}${e.element.stair ? ' (stair)' : ''}`,
    ELEMENT_KIND_LABELS[e.element.kind],
    e.planName,
    e.worstPoint ? `${e.worstPoint.label} (${e.worstPoint.pass === 'initial' ? 'initial' : 'end'}): ${u(e.worstPoint.lux)} ± ${u(e.worstPoint.uLux)}${boundWord(e.worstPoint.luxBound === 'exact' ? null : e.worstPoint.luxBound)}` : 'no reading',
    { text: VERDICT_WORDS[e.verdict], colour: COLOUR[e.verdict] },
  ]));

  for (const p of sitePlans) {
    const mine = s.elements.filter((e) => e.element.planId === p.id);
    if (mine.length === 0 || !p.extent) continue;
    section(doc, `Plan: ${p.name}`);
    drawPlan(doc, p.extent, mine);
  }

  for (const e of s.elements) elementSection(doc, e, u);

  section(doc, 'Test logbook');
  table(doc, [{ title: 'Test', width: 90 }, { title: 'Last done', width: 110 }, { title: 'Next due', width: 90 }, { title: 'State', width: CONTENT_W - 290 }],
    logbook.due.map((d) => [d.kind === 'functional' ? 'Functional' : 'Full duration', d.lastTestedOn ? `${d.lastTestedOn} (${d.lastResult === 'fail' ? 'failed' : 'passed'})` : 'never', d.dueOn ?? 'now',
      { text: d.state === 'overdue' ? `Overdue by ${d.daysOverdue} days` : d.state === 'due_soon' ? 'Due within a week' : d.state === 'never_tested' ? 'Never tested' : 'In date', colour: d.state === 'overdue' || d.state === 'never_tested' ? VERDICT_COLOURS.falls_short : d.state === 'due_soon' ? VERDICT_COLOURS.inconclusive : VERDICT_COLOURS.meets }]));
  doc.font('body').fontSize(9).fillColor(MUTED).text(`Intervals: functional every ${logbook.schedule.functionalEveryDays} days, full duration every ${logbook.schedule.fullDurationEveryMonths} months. The last ${Math.min(logbook.total, REPORT_LOGBOOK_ENTRIES)} of ${logbook.total} entries:`);
  doc.moveDown(0.3);
  table(doc, [{ title: 'Date', width: 62 }, { title: 'Test', width: 70 }, { title: 'By', width: 80 }, { title: 'Result', width: 44 }, { title: 'Failed fittings', width: 110 }, { title: 'Remarks', width: CONTENT_W - 366 }],
    logbook.entries.map((l) => [l.testedOn, l.kind === 'functional' ? 'Functional' : 'Full duration', l.testedBy,
      { text: l.result === 'pass' ? 'Passed' : 'Failed', colour: l.result === 'pass' ? VERDICT_COLOURS.meets : VERDICT_COLOURS.falls_short }, l.failedFittings.join(', ') || '-', l.remarks || '-']));

  section(doc, 'Please note');
  for (const t of s.cautions) doc.font('body').fontSize(10).fillColor(INK).text(`• ${t}`);

  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    doc.font('body').fontSize(7.5).fillColor(MUTED).text(`Luxtrail supports the check; it does not certify. ${s.siteName}: ${s.name}. Page ${i + 1} of ${range.count}.`, MARGIN, A4.height - MARGIN + 14, { width: CONTENT_W, align: 'center', lineBreak: false });
  }
  doc.end();
  return done;
}

function cautionBox(doc: PDFKit.PDFDocument, lines: readonly string[]) {
  const text = lines.join(' ');
  doc.font('bold').fontSize(9.5);
  const h = doc.heightOfString(text, { width: CONTENT_W - 16 }) + 12;
  const top = doc.y;
  doc.rect(MARGIN, top, CONTENT_W, h).lineWidth(1).strokeColor(VERDICT_COLOURS.inconclusive).stroke();
  doc.fillColor(INK).text(text, MARGIN + 8, top + 6, { width: CONTENT_W - 16 });
  doc.x = MARGIN;
  doc.y = top + h + 8;
}

function elementSection(doc: PDFKit.PDFDocument, e: ElementVerdict, u: (lux: number | null) => string) {
  section(doc, `${e.element.code} ${e.element.name}: ${VERDICT_WORDS[e.verdict]}`);
  const el = e.element;
  keyValues(doc, [
    ['Kind', `${ELEMENT_KIND_LABELS[el.kind]}${el.stair ? ', stair' : ''} on ${e.planName}`],
    ...(el.widthM !== null ? [['Width', `${el.widthM} m; central band ${(el.widthM / 2).toFixed(2)} m`] as [string, string]] : []),
    ...(el.kind === 'high_risk_area' ? [['Normal lighting', el.effectiveNormalEmLux === null ? 'not given' : `${u(el.effectiveNormalEmLux)} maintained`] as [string, string]] : []),
    ['Response times', e.response ? `half the level in ${e.response.toHalfS ?? 'n/a'} s, all of it in ${e.response.toFullS ?? 'n/a'} s` : 'not recorded'],
  ]);
  table(doc, [{ title: 'Check', width: 250 }, { title: 'Pass', width: 60 }, { title: 'Verdict', width: 70 }, { title: 'Source', width: CONTENT_W - 380 }],
    e.checks.map((ch) => [ch.text + (ch.roundingNote ? ` ${ch.roundingNote}` : ''), ch.pass === null ? '-' : ch.pass === 'initial' ? 'initial' : 'end', { text: VERDICT_WORDS[ch.verdict], colour: COLOUR[ch.verdict] }, ch.source]));
  for (const r of e.reasons.filter((r) => !e.checks.some((ch) => ch.text === r))) { doc.font('body').fontSize(9).fillColor(MUTED); textWithSymbols(doc, 'body', r, null); }
  for (const m of e.unmeasured) doc.font('body').fontSize(9).fillColor(VERDICT_COLOURS.inconclusive).text(`Not measured in the ${m.pass === 'initial' ? 'initial' : 'end-of-duration'} pass: ${m.labels.join(', ')}`);
  if (e.points.length) {
    doc.moveDown(0.3);
    const passes: EmergencyPass[] = ['initial', 'end_of_duration'];
    table(doc, [{ title: 'Point', width: 70 }, { title: 'Where', width: 70 }, { title: 'Pass', width: 50 }, { title: 'E ± U (k = 2)', width: 150 }, { title: 'Limit', width: 70 }, { title: 'Verdict', width: CONTENT_W - 410 }],
      [...e.points].sort((a, b) => passes.indexOf(a.pass) - passes.indexOf(b.pass) || a.label.localeCompare(b.label)).map((p) => [
        p.label, p.role.replace('_', ' '), p.pass === 'initial' ? 'initial' : 'end',
        `${u(p.lux)} ± ${u(p.uLux)}${boundWord(p.luxBound === 'exact' ? null : p.luxBound)}${p.flag !== 'ok' ? ` [${p.flag.replace('_', ' ')}]` : ''}`,
        p.limitLux === null ? '-' : `≥ ${u(p.limitLux)}`, { text: VERDICT_WORDS[p.verdict], colour: COLOUR[p.verdict] },
      ]));
  }
}

/** The plan's elements drawn to scale: routes as their band and centre line, areas as outlines, equipment as squares, points by verdict. */
function drawPlan(doc: PDFKit.PDFDocument, extent: { widthM: number; heightM: number }, elements: ElementVerdict[]) {
  const boxW = CONTENT_W;
  const boxH = Math.min(320, Math.max(160, boxW * (extent.heightM / extent.widthM)));
  if (doc.y + boxH > A4.height - MARGIN) doc.addPage();
  const top = doc.y;
  const pad = 12;
  const s = Math.min((boxW - 2 * pad) / extent.widthM, (boxH - 2 * pad - 12) / extent.heightM);
  const tx = (x: number) => MARGIN + pad + x * s;
  const ty = (y: number) => top + pad + (extent.heightM - y) * s;
  doc.rect(MARGIN, top, boxW, boxH).lineWidth(0.4).strokeColor(RULE_LINE).stroke();
  doc.rect(tx(0), ty(extent.heightM), extent.widthM * s, extent.heightM * s).lineWidth(0.6).strokeColor(MUTED).stroke();
  for (const e of elements) {
    const g = e.element.geometry;
    const colour = COLOUR[e.verdict];
    if (e.element.kind === 'escape_route') {
      const line = g.map((p) => [tx(p[0]), ty(p[1])] as [number, number]);
      doc.save().lineWidth(Math.max(1, (e.element.widthM ?? 1) * s)).strokeOpacity(0.18).strokeColor(colour).lineJoin('round').lineCap('round');
      doc.moveTo(...line[0]); for (const p of line.slice(1)) doc.lineTo(...p); doc.stroke().restore();
      doc.save().lineWidth(1).strokeColor(colour);
      if (e.element.stair) doc.dash(2, { space: 2 });
      doc.moveTo(...line[0]); for (const p of line.slice(1)) doc.lineTo(...p); doc.stroke().undash().restore();
    } else if (e.element.kind === 'safety_equipment') {
      doc.rect(tx(g[0][0]) - 3, ty(g[0][1]) - 3, 6, 6).lineWidth(1).strokeColor(colour).stroke();
    } else {
      doc.polygon(...g.map((p) => [tx(p[0]), ty(p[1])] as [number, number])).lineWidth(1).strokeColor(colour).stroke();
    }
    doc.font('bold').fontSize(7).fillColor(colour).text(`${e.element.code}${e.element.stair ? ' (stair)' : ''}`, tx(g[0][0]) + 3, ty(g[0][1]) + 3, { lineBreak: false });
    for (const p of e.points) {
      if (p.xM === null || p.yM === null) continue;
      const fill = COLOUR[p.verdict];
      if (p.verdict === 'falls_short') doc.rect(tx(p.xM) - 2.2, ty(p.yM) - 2.2, 4.4, 4.4).fillColor(fill).fill();
      else doc.circle(tx(p.xM), ty(p.yM), 1.8).fillColor(fill).fill();
    }
  }
  const niceM = [1, 2, 5, 10, 20, 50, 100].find((m) => m * s >= (boxW - 2 * pad) / 6) ?? 100;
  const barY = top + boxH - 8;
  doc.moveTo(MARGIN + pad, barY).lineTo(MARGIN + pad + niceM * s, barY).lineWidth(1.5).strokeColor(INK).stroke();
  doc.font('body').fontSize(7).fillColor(INK).text(`${niceM} m`, MARGIN + pad + niceM * s + 4, barY - 4, { lineBreak: false });
  doc.font('body').fontSize(7).fillColor(MUTED).text('Routes: band and centre line (dashed: stair). Squares: points that fall short; dots: others. Colour follows the verdict, which the tables write out.', MARGIN + boxW / 2 - 60, barY - 4, { width: boxW / 2 + 50, align: 'right', lineBreak: false });
  doc.x = MARGIN;
  doc.y = top + boxH + 8;
}
