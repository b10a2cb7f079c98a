// Registers each feature's demo-data step with SEED_STEPS, in this order (import for the side effect).
// 1. calibration: probes and coefficient sets
import './seed-calibration';
// 2. surveys: the demo site, surveys and their imported logs
import './seed-surveys';
// 3. plans: plans and zones of the demo site
import './seed-plans';
// 4. compliance: target library, sign-off of the earlier survey
import './seed-compliance';
export {};
