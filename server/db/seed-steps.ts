// Registers each feature's demo-data step with SEED_STEPS (import for its side effect).
export {};
