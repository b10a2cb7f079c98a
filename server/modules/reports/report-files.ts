import type { SurveyRow } from '../surveys/surveys-service';

export type FileAnswer = { filename: string; contentType: string; content: Buffer };

const slug = (s: string) => s.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'survey';
/** Signed off: "signed-2026-12-02" (the UTC day of the sign-off); otherwise "provisional", so the two never share a name. */
const recordTag = (survey: Partial<Pick<SurveyRow, 'status' | 'signedOffAt'>>) =>
  survey.status === undefined ? '' : survey.status === 'signed_off' && survey.signedOffAt ? `-signed-${new Date(survey.signedOffAt).toISOString().slice(0, 10)}` : '-provisional';
/** A record with no sign-off (no status given) gets no tag. */
export const reportFilename = (survey: Pick<SurveyRow, 'id' | 'name'> & Partial<Pick<SurveyRow, 'status' | 'signedOffAt'>>, ext: string, what = 'report') =>
  `luxtrail-${what}-${survey.id}-${slug(survey.name)}${recordTag(survey)}.${ext}`;
