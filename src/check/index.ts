export * from './policy.js';
export * from './check-plan.js';
export * from './verdict.js';
