export * from './equivalent-square.js';
export * from './inverse-square.js';
export * from './mayneord.js';
export * from './pdd-tpr.js';
export * from './beam-factors.js';
export * from './photon-dose.js';
export * from './beam-data-consistency.js';
export * from './heterogeneity.js';
