import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { registerSiteRoutes } from '../sites/sites-routes';
import { registerSurveyRoutes } from './surveys-routes';
import { registerImportRoutes } from '../imports/imports-routes';
import { registerReadingRoutes } from '../readings/readings-routes';

/** Sites, surveys, log imports and readings: the survey-log feature's routes. */
export function registerSurveyFeatureRoutes(api: Api, deps: Deps) {
  registerSiteRoutes(api, deps);
  registerSurveyRoutes(api, deps);
  registerImportRoutes(api, deps);
  registerReadingRoutes(api, deps);
}
