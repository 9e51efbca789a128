export * from './issue.js';
export * from './vectors.js';
export * from './control-point.js';
export * from './beam.js';
export * from './fraction-group.js';
export * from './dose-reference.js';
export * from './plan.js';
export * from './jaws.js';
