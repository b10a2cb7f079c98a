import { max, min } from 'simple-statistics';
import fs from 'node:fs';
import { asc, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { organizations, storedFiles } from '../../db/schema/organizations';
import { sites } from '../../db/schema/sites';
import { plans, zones } from '../../db/schema/plans';
import { plannedPoints, surveyGrids } from '../../db/schema/grids';
import type { SessionUser } from '@shared/schemas/auth';
import { toSafeCsv } from '@shared/csv-safe';
import { isSafetyRelevant } from '@shared/schemas/zones';
import { GRID_LAYOUT_TEXT, GRID_SURFACE_TEXT, GRID_ROUNDING_TEXT } from '@shared/spatial/measurement-grid';
import { plannedPlaceText } from '@shared/schemas/planned-points';
import { gridRuleText } from '@shared/core/zone-stats';
import { storedPath } from '../../lib/file-store';
import { conflict } from '../../http/errors';
import { getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { planExtent } from '../plans/plans-service';
import { CONTENT_W, INK, MARGIN, MUTED, REPORT_CAUTIONS, RULE_LINE, A4, formatDateTime, keyValues, createReportDocument, section, table } from '../reports/report-pdf';
import { reportFilename, type FileAnswer } from '../reports/reports-service';

type WalkPlan = {
  plan: typeof plans.$inferSelect;
  widthM: number;
  heightM: number;
  imagePath: string | null;
  zones: (typeof zones.$inferSelect)[];
  points: (typeof plannedPoints.$inferSelect & { zoneName: string })[];
};

/** The survey's plans that carry planned points, each with its zones and points (labels in plan order). */
function walkPlans(deps: Deps, survey: SurveyRow): WalkPlan[] {
  const db = deps.db;
  const points = db.select({ p: plannedPoints, zoneName: zones.name }).from(plannedPoints).innerJoin(zones, eq(zones.id, plannedPoints.zoneId))
    .where(eq(plannedPoints.surveyId, survey.id)).orderBy(asc(plannedPoints.planId), asc(plannedPoints.label)).all();
  const planIds = [...new Set(points.map((r) => r.p.planId))];
  if (planIds.length === 0) return [];
  const planRows = db.select({ plan: plans, file: storedFiles }).from(plans).innerJoin(storedFiles, eq(storedFiles.id, plans.fileId)).where(inArray(plans.id, planIds)).orderBy(asc(plans.id)).all();
  const zoneRows = db.select().from(zones).where(inArray(zones.planId, planIds)).orderBy(asc(zones.id)).all();
  return planRows.map(({ plan, file }) => {
    const extent = planExtent(plan)!;
    // pdfkit draws PNG and JPEG; a WebP plan is drawn without its image.
    const path = storedPath(deps, file.sha256);
    const imagePath = (file.contentType === 'image/png' || file.contentType === 'image/jpeg') && fs.existsSync(path) ? path : null;
    return {
      plan, widthM: extent.widthM, heightM: extent.heightM, imagePath,
      zones: zoneRows.filter((z) => z.planId === plan.id),
      points: points.filter((r) => r.p.planId === plan.id).map((r) => ({ ...r.p, zoneName: r.zoneName })),
    };
  });
}

/** Coordinates on the sheet with the full precision the database holds (metres). */
const metres = (v: number) => String(Number(v.toPrecision(12)));

/**
 * The planned points as CSV: label, plan, zone, x_m, y_m (metres from the plan's lower-left corner,
 * y up), full precision; then the plane (horizontal, wall, ceiling) with a wall point's height above
 * the floor and facing (degrees clockwise from the plan's up), empty where they do not apply.
 */
export function plannedPointsCsv(deps: Deps, user: SessionUser, surveyId: number): FileAnswer {
  const survey = getSurveyRow(deps.db, user, surveyId);
  const rows = walkPlans(deps, survey).flatMap((wp) => wp.points.map((p) => [p.label, wp.plan.name, p.zoneName, p.xM, p.yM, p.plane, p.heightM ?? '', p.azimuthDeg ?? '']));
  return {
    filename: reportFilename(survey, 'csv', 'planned-points'), contentType: 'text/csv; charset=utf-8',
    content: Buffer.from(toSafeCsv(['label', 'plan', 'zone', 'x_m', 'y_m', 'plane', 'height_m', 'azimuth_deg'], rows), 'utf8'),
  };
}

function drawPlan(doc: PDFKit.PDFDocument, wp: WalkPlan) {
  const boxW = CONTENT_W;
  const boxH = Math.min(460, A4.height - MARGIN - doc.y - 20);
  const top = doc.y;
  const pad = 14;
  const s = Math.min((boxW - 2 * pad) / wp.widthM, (boxH - 2 * pad - 16) / wp.heightM);
  const ox = MARGIN + pad + ((boxW - 2 * pad) - wp.widthM * s) / 2;
  const oy = top + pad;
  const tx = (x: number) => ox + x * s;
  const ty = (y: number) => oy + (wp.heightM - y) * s;
  doc.rect(MARGIN, top, boxW, boxH).lineWidth(0.4).strokeColor(RULE_LINE).stroke();
  if (wp.imagePath) {
    try {
      doc.save().opacity(0.35).image(wp.imagePath, ox, oy, { width: wp.widthM * s, height: wp.heightM * s }).restore();
    } catch {
      doc.restore();
    }
  }
  doc.rect(ox, oy, wp.widthM * s, wp.heightM * s).lineWidth(0.6).strokeColor(MUTED).stroke();
  for (const z of wp.zones) {
    doc.polygon(...z.polygon.map((p) => [tx(p[0]), ty(p[1])] as [number, number])).lineWidth(1).strokeColor(INK).stroke();
    const cx = min(z.polygon.map((p) => p[0]));
    const cy = max(z.polygon.map((p) => p[1]));
    doc.font('bold').fontSize(7).fillColor(INK).text(z.name, tx(cx) + 2, ty(cy) + 2, { lineBreak: false });
  }
  const label = wp.points.length <= 400;
  const size = wp.points.length > 200 ? 4 : 5;
  for (const p of wp.points) {
    doc.circle(tx(p.xM), ty(p.yM), 1.6).fillColor(INK).fill();
    if (label) doc.font('body').fontSize(size).fillColor(INK).text(p.label, tx(p.xM) + 2, ty(p.yM) - size / 2 - 0.5, { lineBreak: false });
  }
  const niceM = [0.5, 1, 2, 5, 10, 20, 50, 100].find((m) => m * s >= (boxW - 2 * pad) / 6) ?? 100;
  const barY = top + boxH - 9;
  doc.moveTo(MARGIN + pad, barY).lineTo(MARGIN + pad + niceM * s, barY).lineWidth(1.5).strokeColor(INK).stroke();
  doc.font('body').fontSize(7).fillColor(INK).text(`${niceM} m`, MARGIN + pad + niceM * s + 4, barY - 4, { lineBreak: false });
  doc.font('body').fontSize(7).fillColor(MUTED).text(`${wp.plan.name}: ${wp.widthM.toFixed(2)} m × ${wp.heightM.toFixed(2)} m, to scale${label ? '' : ' (too many points to label here: see the table)'}`,
    MARGIN + boxW / 2 - 60, barY - 4, { width: boxW / 2 + 50, align: 'right', lineBreak: false });
  doc.x = MARGIN;
  doc.y = top + boxH + 8;
}

/**
 * The walk sheet: the survey's conditions to fill in, then per plan its zones and labelled planned
 * points drawn to scale and a table of labels with empty columns for readings written by hand.
 */
export async function walkSheetPdf(deps: Deps, user: SessionUser, surveyId: number): Promise<FileAnswer> {
  const survey = getSurveyRow(deps.db, user, surveyId);
  const data = walkPlans(deps, survey);
  if (data.length === 0) throw conflict(`Survey "${survey.name}" has no planned points yet: generate the grids first`);
  const site = deps.db.select().from(sites).where(eq(sites.id, survey.siteId)).get()!;
  const org = deps.db.select().from(organizations).where(eq(organizations.id, survey.organizationId)).get()!;
  const grids = deps.db.select().from(surveyGrids).where(eq(surveyGrids.surveyId, survey.id)).all();
  const content = await renderWalkSheet({ db: deps.db, survey, siteName: site.name, timeZone: site.timeZone, orgName: org.name, plans: data, grids, now: deps.clock.now() });
  return { filename: reportFilename(survey, 'pdf', 'walk-sheet'), contentType: 'application/pdf', content };
}

function renderWalkSheet(d: { db: Db; survey: SurveyRow; siteName: string; timeZone: string; orgName: string; plans: WalkPlan[]; grids: (typeof surveyGrids.$inferSelect)[]; now: number }): Promise<Buffer> {
  const { doc, done } = createReportDocument({ title: `Walk sheet: ${d.siteName}, ${d.survey.name}`, author: d.orgName });
  doc.font('bold').fontSize(20).fillColor(INK).text('Walk sheet');
  doc.moveDown(0.3).font('body').fontSize(12).fillColor(MUTED).text(d.orgName);
  doc.moveDown(0.6);
  const total = d.plans.reduce((n, p) => n + p.points.length, 0);
  keyValues(doc, [
    ['Site', d.siteName],
    ['Survey', d.survey.name],
    ['Planned points', `${total} on ${d.plans.length} plan(s)`],
    ['Grid rule', `${gridRuleText(d.survey.gridRounding)}. ${GRID_ROUNDING_TEXT[d.survey.gridRounding]}.`],
    ['Printed', formatDateTime(d.now, d.timeZone)],
  ]);
  const noted = d.grids.filter((g) => g.reason || g.layout === 'centreline' || g.surface !== 'working_plane');
  if (noted.length > 0) {
    const zoneNames = new Map(d.plans.flatMap((p) => p.zones.map((z) => [z.id, z.name] as const)));
    doc.moveDown(0.3);
    keyValues(doc, noted.map((g) => [`${zoneNames.get(g.zoneId) ?? g.code}${g.surface === 'working_plane' ? '' : `, ${g.surface === 'walls' ? 'walls' : 'ceiling'}`}`, [
      g.surface !== 'working_plane' ? GRID_SURFACE_TEXT[g.surface] + (g.wallHeightM !== null ? ` (room height ${metres(g.wallHeightM)} m)` : '') : null,
      g.layout === 'centreline' ? GRID_LAYOUT_TEXT.centreline : null, g.reason ? `Changed grid: ${g.reason}` : null,
    ].filter(Boolean).join('. ')]));
  }

  section(doc, 'Conditions (fill in on site)');
  const cond = d.survey.conditions;
  if (cond) doc.font('body').fontSize(10).fillColor(INK).text(`Recorded: ${cond.daylightExcluded ? 'daylight excluded (electric lighting only)' : 'daylight present'}${cond.notes ? `. ${cond.notes}` : ''}`).moveDown(0.3);
  table(doc, [{ title: 'Condition', width: 170 }, { title: 'Value', width: CONTENT_W - 170 }], [
    'Date and time lights switched on', 'Measured by', 'Probe serial(s) and working plane height (m)', 'Supply voltage (V)', 'Ambient temperature (°C)',
    'Sky and daylight (blinds, curtains)', 'Lamps burnt in and stable (yes / no)', 'Notes',
  ].map((c) => [c, '']));

  const safety = d.plans.some((p) => p.zones.some((z) => isSafetyRelevant(z.useType)));
  if (safety) {
    doc.moveDown(0.3).font('body').fontSize(8.5).fillColor(MUTED).text(`${REPORT_CAUTIONS[0]} ${REPORT_CAUTIONS[1]}`, { width: CONTENT_W });
  }

  for (const wp of d.plans) {
    doc.addPage();
    section(doc, `Plan: ${wp.plan.name}`, true);
    drawPlan(doc, wp);
    section(doc, `Points on ${wp.plan.name}`);
    table(doc, [
      { title: 'Label', width: 64 }, { title: 'Zone', width: 80 }, { title: 'x (m)', width: 40 }, { title: 'y (m)', width: 40 },
      { title: 'Read on', width: 84 }, { title: 'Reading (lx)', width: 62 }, { title: 'Time', width: 44 }, { title: 'Note', width: CONTENT_W - 414 },
    ], wp.points.map((p) => [p.label, p.zoneName, metres(p.xM), metres(p.yM), plannedPlaceText(p, metres), '', '', '']));
  }
  doc.end();
  return done;
}
