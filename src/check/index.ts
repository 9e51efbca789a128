export * from './policy.js';
export * from './check-plan.js';
export * from './verdict.js';
export * from './plan-depths.js';
export type { PatientCt } from './patient-ct.js';
export * from './validate-beam-data.js';
export * from './match-machine.js';
export { buildUpFlags, electronDepthFlags } from './beam/point-fitness.js';
export * from './electron-energy.js';
