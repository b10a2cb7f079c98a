import { describe, expect, it } from 'vitest';
import { CAPABILITIES, type Capability } from '@shared/policy';
import { ROLES, type Role } from '@shared/roles';
import { SURVEY_STATUSES, type SurveyStatus } from '@shared/schemas/surveys';
import { FOUR_EYES, surveyAbilities, surveyRefusal } from '@shared/survey-abilities';

const survey = (status: SurveyStatus, submittedBy: number | null = null) => ({ name: 'Autumn walk', status, submittedBy });
const user = (role: Role, id = 1) => ({ id, role });
const roleCan = (role: Role, c: Capability) => (CAPABILITIES[c] as readonly Role[]).includes(role);

describe('surveyAbilities', () => {
  it('allows logs, edits and submission only while a survey is a draft or returned', () => {
    for (const status of SURVEY_STATUSES) {
      const a = surveyAbilities(user('surveyor'), survey(status));
      const workedOn = status === 'draft' || status === 'returned';
      expect({ status, upload: a.upload, edit: a.edit, submit: a.submit }).toEqual({ status, upload: workedOn, edit: workedOn, submit: workedOn });
    }
  });

  it('allows sign-off and return only of a submitted survey, and re-decoding of any survey not signed off', () => {
    for (const status of SURVEY_STATUSES) {
      const reviewer = surveyAbilities(user('facility_manager', 9), survey(status, 2));
      expect(reviewer.signOff).toBe(status === 'submitted');
      expect(reviewer.return).toBe(status === 'submitted');
      expect(surveyAbilities(user('calibration'), survey(status)).redecode).toBe(status !== 'signed_off');
      expect(surveyAbilities(user('surveyor'), survey(status)).setInstallation).toBe(status !== 'signed_off');
    }
  });

  it('never grants what the role table refuses the role', () => {
    const need = { edit: 'surveys.write', setInstallation: 'surveys.write', upload: 'surveys.upload', submit: 'surveys.submit', signOff: 'surveys.review', return: 'surveys.review', redecode: 'surveys.redecode' } as const;
    for (const role of ROLES) for (const status of SURVEY_STATUSES) {
      const a = surveyAbilities(user(role, 5), survey(status, 6));
      for (const [ability, capability] of Object.entries(need)) if (!roleCan(role, capability)) expect(a[ability as keyof typeof a], `${role} ${ability}`).toBe(false);
    }
  });

  it('refuses sign-off by the person who submitted the survey with 403 four_eyes, but lets them return it', () => {
    const submitter = user('admin', 3);
    expect(surveyRefusal(submitter, survey('submitted', 3), 'signOff')).toMatchObject({ status: 403, code: FOUR_EYES });
    expect(surveyRefusal(submitter, survey('submitted', 3), 'return')).toBeNull();
    expect(surveyRefusal(user('admin', 4), survey('submitted', 3), 'signOff')).toBeNull();
  });

  it('names the survey and its state in a 409 refusal', () => {
    expect(surveyRefusal(user('surveyor'), survey('signed_off'), 'upload')).toEqual({ status: 409, code: 'conflict', message: expect.stringMatching(/Survey "Autumn walk" is signed off/) });
  });
});
