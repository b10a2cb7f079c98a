// Registers each feature's demo-data step with SEED_STEPS, in this order (import for the side effect).
// 1. calibration: probes and coefficient sets
import './seed-calibration';
// 2. surveys: the demo site and its surveys
import './seed-surveys';
// 3. plans: plans and zones of the demo site
import './seed-plans';
// 3b. survey logs: the walk-throughs' logs (their rows name the plans of step 3), then submitted
import './seed-survey-logs';
// 4. compliance: target library, sign-off of the earlier survey
import './seed-compliance';
export {};
