// Seed step: the demo walk-throughs' logs, imported once the plans their rows name exist.
import { SEED_STEPS } from './seed';
import { seedSurveyLogs } from './seed-surveys';

SEED_STEPS.push({ name: 'survey-logs', run: seedSurveyLogs });
