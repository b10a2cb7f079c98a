import { queryString } from '@/lib/api-client';

/** Download addresses of a survey's report and exports (plain links: the browser downloads them). */
export const reportLinks = (surveyId: number, unit: 'lx' | 'fc') => ({
  pdf: `/api/surveys/${surveyId}/report.pdf${queryString({ unit })}`,
  zonesCsv: `/api/surveys/${surveyId}/compliance/zones.csv`,
  readingsCsv: `/api/surveys/${surveyId}/compliance/readings.csv`,
});
