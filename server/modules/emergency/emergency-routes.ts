import { z } from 'zod';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { EMERGENCY_TEST_KINDS, TEST_REMINDER_STATES } from '@shared/core/emergency-schedule';
import {
  createEmergencySurveyBodySchema, criteriaSetBodySchema, criteriaSetKeyParamsSchema, criteriaSetListSchema, criteriaSetSchema, elementResponseParamsSchema,
  emergencyElementBodySchema, emergencyElementListSchema, emergencyElementSchema, emergencySurveyListQuerySchema, emergencySurveyListSchema,
  emergencySurveySchema, logPassBodySchema, logPassParamsSchema, logbookEntryBodySchema, logbookEntrySchema, logbookQuerySchema, responseTimesBodySchema, siteLogbookSchema,
  testScheduleSchema, testsDueOverviewSchema, updateEmergencySurveyBodySchema,
} from '@shared/schemas/emergency';
import { createElement, deleteElement, listElements, updateElement } from './elements-service';
import { createCriteriaSet, listCriteriaSets, presentCriteriaSet, updateCriteriaSet } from './criteria-service';
import { createEmergencySurvey, judgeEmergencySurvey, listEmergencySurveys, setLogPass, setResponseTimes, updateEmergencySurvey } from './emergency-surveys-service';
import { addLogbookEntry, scheduleOf, setSchedule, siteLogbook, testsDueOverview } from './logbook-service';
import { runEmergencyTestReminders } from './test-reminders-service';
import { emergencyReportPdf, registerEmergencyReportAttachment } from './emergency-report';

const reminderRunSchema = z.object({ messagesSent: z.number().int(), reminded: z.array(z.object({ siteId: z.number().int(), kind: z.enum(EMERGENCY_TEST_KINDS), state: z.enum(TEST_REMINDER_STATES), dueOn: z.string() })) });

/** Emergency lighting: elements on plans, criteria sets, emergency surveys and verdicts, the test logbook, the report. */
export function registerEmergencyRoutes(api: Api, deps: Deps) {
  registerEmergencyReportAttachment(deps);
  api.route({ method: 'get', path: '/plans/:id/emergency-elements', access: 'sites.read', tag: 'emergency', summary: 'Escape routes, open and high-risk areas and safety equipment drawn on a plan, with their planned points', params: idParamsSchema, response: emergencyElementListSchema },
    ({ user, params }) => ({ items: listElements(deps.db, user, params.id) }));
  api.route({ method: 'post', path: '/plans/:id/emergency-elements', access: 'plans.write', tag: 'emergency', summary: 'Draw an escape route (centre line, width, stair), an open or high-risk area (outline) or a safety-equipment point; 422 names each geometric problem, 409 a code in use', params: idParamsSchema, body: emergencyElementBodySchema, status: 201, response: emergencyElementSchema },
    ({ user, params, body }) => createElement(deps, user, params.id, body));
  api.route({ method: 'put', path: '/emergency-elements/:id', access: 'plans.write', tag: 'emergency', summary: 'Replace an element\'s definition (same kind)', params: idParamsSchema, body: emergencyElementBodySchema, response: emergencyElementSchema },
    ({ user, params, body }) => updateElement(deps, user, params.id, body));
  api.route({ method: 'delete', path: '/emergency-elements/:id', access: 'plans.write', tag: 'emergency', summary: 'Delete an element (409 once a survey recorded its response times)', params: idParamsSchema },
    ({ user, params }) => { deleteElement(deps, user, params.id); });

  api.route({ method: 'get', path: '/emergency/criteria-sets', access: 'surveys.read', tag: 'emergency', summary: 'Built-in criteria sets (EN 1838:2013, NFPA 101 §7.9.2) and the organisation\'s own', response: criteriaSetListSchema },
    ({ user }) => ({ items: listCriteriaSets(deps.db, user.organizationId).map(presentCriteriaSet) }));
  api.route({ method: 'post', path: '/emergency/criteria-sets', access: 'organization.settings', tag: 'emergency', summary: 'Add an organisation\'s own criteria set (checks as data, each naming its source)', body: criteriaSetBodySchema, status: 201, response: criteriaSetSchema },
    ({ user, body }) => createCriteriaSet(deps, user, body));
  api.route({ method: 'put', path: '/emergency/criteria-sets/:key', access: 'organization.settings', tag: 'emergency', summary: 'Replace one of the organisation\'s own criteria sets (built-in sets answer 404: base a set of your own on one); signed-off surveys keep the set they were frozen with', params: criteriaSetKeyParamsSchema, body: criteriaSetBodySchema, response: criteriaSetSchema },
    ({ user, params, body }) => updateCriteriaSet(deps, user, params.key, body));

  api.route({ method: 'get', path: '/emergency/surveys', access: 'surveys.read', tag: 'emergency', summary: 'Emergency surveys', query: emergencySurveyListQuerySchema, response: emergencySurveyListSchema },
    ({ user, query }) => ({ items: listEmergencySurveys(deps.db, user, query.siteId) }));
  api.route({ method: 'post', path: '/emergency/surveys', access: 'surveys.write', tag: 'emergency', summary: 'Start an emergency survey: criteria set and conditions (system type, rated duration, when the mains failed)', body: createEmergencySurveyBodySchema, status: 201, response: emergencySurveySchema },
    ({ user, body }) => createEmergencySurvey(deps, user, body));
  api.route({ method: 'get', path: '/emergency/surveys/:id', access: 'surveys.read', tag: 'emergency', summary: 'An emergency survey with its passes and the verdict of every route, area and point', params: idParamsSchema, response: emergencySurveySchema },
    ({ user, params }) => judgeEmergencySurvey(deps.db, user, params.id));
  api.route({ method: 'patch', path: '/emergency/surveys/:id', access: 'surveys.write', tag: 'emergency', summary: 'Change the criteria set or conditions (draft or returned only)', params: idParamsSchema, body: updateEmergencySurveyBodySchema, response: emergencySurveySchema },
    ({ user, params, body }) => updateEmergencySurvey(deps, user, params.id, body));
  api.route({ method: 'put', path: '/emergency/surveys/:id/responses/:elementId', access: 'surveys.write', tag: 'emergency', summary: 'Record the response times measured for one element (seconds to half and to all of the required level)', params: elementResponseParamsSchema, body: responseTimesBodySchema, response: emergencySurveySchema },
    ({ user, params, body }) => setResponseTimes(deps, user, params.id, params.elementId, body));
  api.route({ method: 'put', path: '/emergency/surveys/:id/logs/:importId/pass', access: 'surveys.write', tag: 'emergency', summary: 'Say which pass one of the survey\'s logs holds (initial or end_of_duration), or null to split it by time again (draft or returned only)', params: logPassParamsSchema, body: logPassBodySchema, response: emergencySurveySchema },
    ({ user, params, body }) => setLogPass(deps, user, params.id, params.importId, body.pass));
  api.route({ method: 'get', path: '/emergency/surveys/:id/report.pdf', access: 'surveys.read', tag: 'emergency', summary: 'The emergency survey report as PDF (unit=lx|fc)', params: idParamsSchema, query: z.object({ unit: z.enum(['lx', 'fc']).default('lx') }), produces: 'application/pdf' },
    async ({ user, params, query, res }) => {
      const file = await emergencyReportPdf(deps, user, params.id, query.unit);
      res.setHeader('Content-Type', 'application/pdf');
      res.setHeader('Content-Disposition', `attachment; filename="${file.filename}"`);
      res.setHeader('Cache-Control', 'private, no-store');
      res.send(file.content);
    });

  api.route({ method: 'get', path: '/sites/:id/emergency-tests', access: 'surveys.read', tag: 'emergency', summary: 'The site\'s emergency lighting test logbook (latest first) and when each test is next due', params: idParamsSchema, query: logbookQuerySchema, response: siteLogbookSchema },
    ({ user, params, query }) => siteLogbook(deps, user, params.id, query.limit));
  api.route({ method: 'post', path: '/sites/:id/emergency-tests', access: 'logbook.write', tag: 'emergency', summary: 'Record a functional or full-duration test (append-only)', params: idParamsSchema, body: logbookEntryBodySchema, status: 201, response: logbookEntrySchema },
    ({ user, params, body }) => addLogbookEntry(deps, user, params.id, body));
  api.route({ method: 'get', path: '/emergency/tests-due', access: 'surveys.read', tag: 'emergency', summary: 'Every visible site\'s next functional and full-duration test, overdue first', response: testsDueOverviewSchema },
    ({ user }) => testsDueOverview(deps, user));
  api.route({ method: 'get', path: '/emergency/test-schedule', access: 'surveys.read', tag: 'emergency', summary: 'The organisation\'s test intervals', response: testScheduleSchema },
    ({ user }) => scheduleOf(deps.db, user.organizationId));
  api.route({ method: 'put', path: '/emergency/test-schedule', access: 'organization.settings', tag: 'emergency', summary: 'Set the organisation\'s own test intervals', body: testScheduleSchema, response: testScheduleSchema },
    ({ user, body }) => setSchedule(deps, user, body));
  api.route({ method: 'post', path: '/emergency/reminders/run', access: 'reminders.run', tag: 'emergency', summary: 'Send this organisation\'s emergency test reminders now (due within 7 days or overdue, at most one per site and test a week)', response: reminderRunSchema },
    ({ user }) => runEmergencyTestReminders(deps, user.organizationId));
}
