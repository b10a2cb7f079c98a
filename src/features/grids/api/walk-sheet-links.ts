/** Downloads of a survey's planned points (plain links: the browser saves the file). */
export const walkSheetUrl = (surveyId: number) => `/api/surveys/${surveyId}/walk-sheet.pdf`;
export const plannedPointsCsvUrl = (surveyId: number) => `/api/surveys/${surveyId}/planned-points.csv`;
