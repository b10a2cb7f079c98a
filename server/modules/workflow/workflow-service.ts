import { and, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { surveys } from '../../db/schema/surveys';
import { userSites, users } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import type { SubmitSurveyBody, SignOffBody, ReturnSurveyBody, WorkflowState } from '@shared/schemas/workflow';
import { zoneVerdictCountsText } from '@shared/schemas/compliance';
import { conflict } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { assertSurveyAbility, getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { WORKED_ON_STATUSES } from '@shared/survey-abilities';
import { buildFrozen, countVerdicts } from '../compliance/compliance-service';
import { reportAttachment } from '../reports/reports-service';
import { freezeEmergency } from '../emergency/emergency-surveys-service';
import { emergencyReportAttachment, reportLogbook } from '../emergency/emergency-report';
import { freezeAggregate } from '../compliance/verdict-aggregates';
import { absoluteUrl, paths } from '@shared/paths';

function userById(db: Db, id: number | null) {
  return id === null ? undefined : db.select().from(users).where(eq(users.id, id)).get();
}

function state(db: Db, surveyId: number, notified: string[]): WorkflowState {
  const s = db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
  return {
    surveyId: s.id, status: s.status,
    submittedAt: s.submittedAt ? new Date(s.submittedAt).toISOString() : null, submittedByName: userById(db, s.submittedBy)?.name ?? null,
    signedOffAt: s.signedOffAt ? new Date(s.signedOffAt).toISOString() : null, signedOffByName: userById(db, s.signedOffBy)?.name ?? null,
    reviewComment: s.reviewComment, notified,
  };
}

/** Facility managers who may see the site (no site rows: every site), or the admins when there are none. */
function reviewersOf(db: Db, organizationId: number, siteId: number): { email: string; name: string }[] {
  const active = db.select().from(users).where(and(eq(users.organizationId, organizationId), eq(users.status, 'active'))).all();
  const managers = active.filter((u) => u.role === 'facility_manager');
  const links = managers.length ? db.select().from(userSites).where(inArray(userSites.userId, managers.map((m) => m.id))).all() : [];
  const inScope = managers.filter((m) => {
    const mine = links.filter((l) => l.userId === m.id);
    return mine.length === 0 || mine.some((l) => l.siteId === siteId);
  });
  return (inScope.length ? inScope : active.filter((u) => u.role === 'admin')).map((u) => ({ email: u.email, name: u.name }));
}

/** The surveyor to tell about a review: who submitted it, else who created it. */
function surveyorOf(db: Db, survey: SurveyRow) {
  return userById(db, survey.submittedBy ?? survey.createdBy);
}

export function submitSurvey(deps: Deps, actor: SessionUser, surveyId: number, body: SubmitSurveyBody): WorkflowState {
  const survey = getSurveyRow(deps.db, actor, surveyId);
  assertSurveyAbility(actor, survey, 'submit');
  if (survey.activeDecodeId === null) throw conflict(`Survey "${survey.name}" has no decoded readings yet: upload a log before submitting`);
  const now = deps.clock.now();
  const reviewers = reviewersOf(deps.db, actor.organizationId, survey.siteId);
  deps.db.transaction((tx) => {
    const changed = tx.update(surveys).set({ status: 'submitted', submittedBy: actor.id, submittedAt: now, reviewComment: null })
      .where(and(eq(surveys.id, survey.id), inArray(surveys.status, [...WORKED_ON_STATUSES]))).run();
    if (changed.changes !== 1) throw conflict('Someone changed this survey at the same moment; reload it and try again');
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'submitted', before: { status: survey.status }, after: { status: 'submitted', note: body.note ?? null }, at: now });
    if (reviewers.length) {
      deps.mailer.queue(tx, {
        to: reviewers.map((r) => r.email), organizationId: actor.organizationId,
        subject: `Survey submitted for review: ${survey.site.name}, ${survey.name}`,
        text: `${actor.name} submitted "${survey.name}" at ${survey.site.name} for review.\n${body.note ? `\nTheir note:\n${body.note}\n` : ''}\nOpen it in Luxtrail to sign it off or return it with a comment.\n${absoluteUrl(deps.config.publicUrl, paths.surveyCompliance.to(survey.id))}\n`,
      });
    }
  });
  return state(deps.db, survey.id, reviewers.map((r) => r.email));
}

/**
 * Signs a submitted survey off: freezes its verdicts, targets, coefficient sets and decision rule
 * into surveys.frozen, records it, and queues the mail to the surveyor (and the signer) in the same
 * transaction. The PDF is built from the frozen record when the mail is delivered, so it shows
 * exactly what was signed off and the request waits for neither the PDF nor the mail server.
 */
export async function signOffSurvey(deps: Deps, actor: SessionUser, surveyId: number, body: SignOffBody): Promise<WorkflowState> {
  const survey = getSurveyRow(deps.db, actor, surveyId);
  assertSurveyAbility(actor, survey, 'signOff');
  const now = deps.clock.now();
  // Judged off the request's thread (verdict-aggregates.ts); the sign-off then freezes that aggregate.
  // An emergency survey's verdicts and logbook are frozen in the same snapshot (emergency-surveys-service).
  const emergency = freezeEmergency(deps.db, actor, survey, (siteId) => reportLogbook(deps, actor, siteId));
  const frozen = { ...await buildFrozen(deps.db, actor.organizationId, survey, now), ...(emergency ? { emergency } : {}) };
  const surveyor = surveyorOf(deps.db, survey);
  const to = [...new Set([surveyor?.email, actor.email].filter((e): e is string => !!e))];
  const counts = countVerdicts(frozen.zones);
  deps.db.transaction((tx) => {
    const changed = tx.update(surveys).set({ status: 'signed_off', signedOffBy: actor.id, signedOffAt: now, reviewComment: body.comment ?? null, frozen })
      .where(and(eq(surveys.id, survey.id), eq(surveys.status, 'submitted'))).run();
    if (changed.changes !== 1) throw conflict('Someone changed this survey at the same moment; reload it and try again');
    // The judged zones' readings stay in the aggregate: keep it for good (gone: the verdicts changed meanwhile).
    if (frozen.aggregateId !== undefined && !freezeAggregate(tx, frozen.aggregateId)) throw conflict('The verdicts changed while the survey was being signed off (a zone, target or the rule was edited); sign it off again');
    recordAudit(tx, {
      organizationId: actor.organizationId, actorId: actor.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'signed_off',
      before: { status: survey.status },
      after: { status: 'signed_off', comment: body.comment ?? null, rule: frozen.rule, counts, decodeId: frozen.decodeId, targetIds: frozen.targets.map((t) => t.id), coefficientSetIds: frozen.coefficientSets.map((s) => s.id), ...(emergency ? { emergencyVerdict: emergency.judged.verdict, criteriaSetKey: emergency.judged.criteriaSet.key } : {}) },
      at: now,
    });
    deps.mailer.queue(tx, {
      to, organizationId: actor.organizationId,
      subject: `Survey signed off: ${survey.site.name}, ${survey.name}`,
      text: `${actor.name} signed off "${survey.name}" at ${survey.site.name}.\n${body.comment ? `\nComment:\n${body.comment}\n` : ''}\n`
        + (emergency ? `${emergencyCounts(emergency.judged.elements)} (criteria: ${emergency.judged.criteriaSet.name}; decision rule: ${frozen.rule}).\n`
          : `${zoneVerdictCountsText(counts)} (decision rule: ${frozen.rule}).\n`)
        + '\nThe signed-off report is attached. The survey is now read-only.\n',
      // An emergency survey's report is the emergency report, built from the same frozen record.
      pendingAttachments: [emergency ? emergencyReportAttachment(survey) : reportAttachment(survey)],
    });
  });
  return state(deps.db, survey.id, to);
}

/** "4 route(s), area(s) and equipment point(s): 2 meet, 1 fall short, ..." for the sign-off e-mail. */
function emergencyCounts(elements: { verdict: string }[]): string {
  const n = (v: string) => elements.filter((e) => e.verdict === v).length;
  return `${elements.length} route(s), area(s) and equipment point(s): ${n('meets')} meet, ${n('falls_short')} fall short, ${n('inconclusive')} inconclusive, ${n('not_judged')} not judged`;
}

/** Returns a submitted survey to the surveyor with a comment saying what to change. */
export function returnSurvey(deps: Deps, actor: SessionUser, surveyId: number, body: ReturnSurveyBody): WorkflowState {
  const survey = getSurveyRow(deps.db, actor, surveyId);
  assertSurveyAbility(actor, survey, 'return');
  const now = deps.clock.now();
  const surveyor = surveyorOf(deps.db, survey);
  deps.db.transaction((tx) => {
    const changed = tx.update(surveys).set({ status: 'returned', reviewComment: body.comment }).where(and(eq(surveys.id, survey.id), eq(surveys.status, 'submitted'))).run();
    if (changed.changes !== 1) throw conflict('Someone changed this survey at the same moment; reload it and try again');
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'returned', before: { status: survey.status }, after: { status: 'returned', comment: body.comment }, at: now });
    if (surveyor) {
      deps.mailer.queue(tx, {
        to: surveyor.email, organizationId: actor.organizationId,
        subject: `Survey returned for changes: ${survey.site.name}, ${survey.name}`,
        text: `${actor.name} returned "${survey.name}" at ${survey.site.name} for changes.\n\nComment:\n${body.comment}\n\nYou can add logs and submit it again.\n${absoluteUrl(deps.config.publicUrl, paths.surveyCompliance.to(survey.id))}\n`,
      });
    }
  });
  return state(deps.db, survey.id, surveyor ? [surveyor.email] : []);
}
