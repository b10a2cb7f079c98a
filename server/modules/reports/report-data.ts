import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { organizations, users } from '../../db/schema/organizations';
import { sites } from '../../db/schema/sites';
import type { SurveyRow } from '../surveys/surveys-service';
import { complianceOf, surveyVerdicts, zoneMembers, type FrozenZone, type SurveyCompliance } from '../compliance/compliance-service';
import { loadReportPointGroups, loadUsedCoefficientSets, type PointColumns, type ReadingPoint, type UsedCoefficientSet } from '../compliance/compliance-repository';
import type { ReportPhoto, ReportZoneNote } from '../field/field-photos';
import type { FieldSession } from '@shared/schemas/field';

export type ReportData = {
  organizationName: string;
  site: { name: string; address: string | null; timeZone: string };
  survey: SurveyRow;
  submittedByName: string | null;
  signedOffByName: string | null;
  compliance: SurveyCompliance;
  /**
   * Judged zones in the summary's order, with their outlines and the readings they used: as
   * ReadingPoints when drawn point by point, else (`columns`, readings and wallBandReadings empty)
   * as the columns a drawing of merged dots needs.
   */
  zones: (FrozenZone & { readings: ReadingPoint[]; wallBandReadings: ReadingPoint[]; columns?: { used: PointColumns; band: PointColumns } })[];
  coefficientSets: UsedCoefficientSet[];
  generatedAt: number;
  /** Photos taken in the field (the appendix), with the stored file to embed; absent: none. */
  photos?: ReportPhoto[];
  /** Notes written on whole zones in the field (the same appendix); absent: none. */
  zoneNotes?: ReportZoneNote[];
  /** The conditions of each field visit, and the notes on readings those conditions put in doubt (method section). */
  fieldConditions?: { sessions: FieldSession[]; warmUpMinutes: number; notes: string[] };
};

const nameOf = (db: Db, id: number | null) => (id === null ? null : db.select({ name: users.name }).from(users).where(eq(users.id, id)).get()?.name ?? null);

/** Above this many points (used and wall band) a zone's drawing merges the points under each dot (report-pdf.ts). */
export const MAX_DRAWN_POINTS = 2000;

/**
 * Everything the PDF shows, from the frozen sign-off when there is one (runs on a compute thread).
 * `allPoints`: every zone's readings as ReadingPoints (the field conditions' notes read them);
 * otherwise a zone drawn as merged dots keeps only columns (500,000 readings: about 97 MB as
 * objects, 12 MB as columns).
 */
export async function loadReportData(db: Db, survey: SurveyRow, now: number, options: { allPoints?: boolean } = {}): Promise<ReportData> {
  const site = db.select().from(sites).where(eq(sites.id, survey.siteId)).get()!;
  const org = db.select().from(organizations).where(eq(organizations.id, survey.organizationId)).get()!;
  const verdicts = await surveyVerdicts(db, survey);
  const compliance = await complianceOf(db, survey, verdicts);
  const byId = new Map(verdicts.zones.map((z) => [z.zoneId, z]));
  const judged = compliance.zones.map((c) => ({ c, z: byId.get(c.zoneId)! }));
  const groups = judged.flatMap(({ z }) => {
    const members = zoneMembers(db, verdicts, z);
    return [members.readingIds, members.wallBandReadingIds];
  });
  const asPoints = (zone: number) => options.allPoints || groups[2 * zone].length + groups[2 * zone + 1].length <= MAX_DRAWN_POINTS;
  const loaded = loadReportPointGroups(db, survey.id, groups, (group) => asPoints(Math.floor(group / 2)));
  const zones = judged.map(({ c, z }, i) => {
    const [used, band] = [loaded[2 * i], loaded[2 * i + 1]];
    return { ...z, change: c.change, readings: used.points ?? [], wallBandReadings: band.points ?? [], ...(used.columns && band.columns ? { columns: { used: used.columns, band: band.columns } } : {}) };
  });
  const coefficientSets = verdicts.frozen?.coefficientSets ?? loadUsedCoefficientSets(db, verdicts.coefficientSetReadings ?? []);
  return {
    organizationName: org.name,
    site: { name: site.name, address: site.address, timeZone: site.timeZone },
    survey,
    submittedByName: nameOf(db, survey.submittedBy),
    signedOffByName: nameOf(db, survey.signedOffBy),
    compliance,
    zones,
    coefficientSets,
    generatedAt: now,
  };
}
