import { can, type Capability } from './policy';
import type { Role } from './roles';
import { SURVEY_ABILITIES, type SurveyAbilities, type SurveyAbility, type SurveyStatus } from './schemas/surveys';

/**
 * What this person may do with this survey now. The role table (policy.ts) answers "may this
 * role ever"; this answers "may this user, on this record, in its present state". Services
 * refuse through `surveyRefusal`, survey answers carry `surveyAbilities(...)`, and the client
 * only reads those flags. The list of abilities and their schema live in schemas/surveys.ts.
 */

/** The error code of every four-eyes refusal (403): a second person must do this. */
export const FOUR_EYES = 'four_eyes';

export type SurveyAbilityUser = { id: number; role: Role };
export type SurveyAbilitySubject = { name: string; status: SurveyStatus; submittedBy: number | null };

/** Why an ability is refused: the HTTP status, error code and a message naming the survey. */
export type SurveyRefusal = { status: 403 | 409; code: 'forbidden' | 'conflict' | typeof FOUR_EYES; message: string };

const CAPABILITY: Record<SurveyAbility, Capability> = {
  edit: 'surveys.write',
  setInstallation: 'surveys.write',
  upload: 'surveys.upload',
  submit: 'surveys.submit',
  signOff: 'surveys.review',
  return: 'surveys.review',
  redecode: 'surveys.redecode',
};

/** A survey changes (settings, logs) and is submitted only while it is worked on. */
export const WORKED_ON_STATUSES: readonly SurveyStatus[] = ['draft', 'returned'];
const WORKED_ON = WORKED_ON_STATUSES;

const state = (s: SurveyAbilitySubject) => `Survey "${s.name}" is ${s.status.replace('_', ' ')}`;

/** The one statement of the survey rules; null when the user may. */
export function surveyRefusal(user: SurveyAbilityUser, survey: SurveyAbilitySubject, ability: SurveyAbility): SurveyRefusal | null {
  if (!can(user.role, CAPABILITY[ability])) return { status: 403, code: 'forbidden', message: 'Your role does not allow this' };
  switch (ability) {
    case 'edit':
      return WORKED_ON.includes(survey.status) ? null
        : { status: 409, code: 'conflict', message: `${state(survey)}: its settings can change only while it is a draft or returned for changes` };
    case 'setInstallation':
      // New or in service decides which target a verdict uses; frozen verdicts keep theirs.
      return survey.status === 'signed_off'
        ? { status: 409, code: 'conflict', message: `${state(survey)}: its verdicts are frozen, so its installation cannot change` }
        : null;
    case 'upload':
      return WORKED_ON.includes(survey.status) ? null
        : { status: 409, code: 'conflict', message: `${state(survey)}: logs can be added only while it is a draft or returned for changes` };
    case 'submit':
      return WORKED_ON.includes(survey.status) ? null
        : { status: 409, code: 'conflict', message: `${state(survey)}: only a draft or a returned survey can be submitted` };
    case 'signOff':
      if (survey.status !== 'submitted') return { status: 409, code: 'conflict', message: `${state(survey)}: only a submitted survey can be signed off` };
      // Separation of duties: whoever submitted a survey does not sign it off.
      return survey.submittedBy === user.id
        ? { status: 403, code: FOUR_EYES, message: 'Four-eyes rule: you submitted this survey, so another reviewer must sign it off' }
        : null;
    case 'return':
      return survey.status === 'submitted' ? null
        : { status: 409, code: 'conflict', message: `${state(survey)}: only a submitted survey can be returned` };
    case 'redecode':
      return survey.status === 'signed_off'
        ? { status: 409, code: 'conflict', message: 'This survey is signed off and read-only; its readings are not re-decoded' }
        : null;
  }
}

export function surveyAbilities(user: SurveyAbilityUser, survey: SurveyAbilitySubject): SurveyAbilities {
  return Object.fromEntries(SURVEY_ABILITIES.map((a) => [a, surveyRefusal(user, survey, a) === null])) as SurveyAbilities;
}
