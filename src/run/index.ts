// The application layer both front doors (cli/, service/) share: inputs loaded, files checked, documents built.
export * from './beam-data.js';
export * from './beam-data-stamp.js';
export * from './check-arrival.js';
export * from './check-document.js';
export * from './check-file.js';
export * from './check-files.js';
export * from './check-inputs.js';
export * from './collect-files.js';
export * from './demo-files.js';
export * from './json-file.js';
export * from './manual-calc.js';
export * from './patient-cts.js';
export * from './plan-depths-from-ct.js';
export * from './policy-file.js';
export * from './read-plans.js';
export * from './validate-machine.js';
export * from './version.js';
// Types and readers the front doors name, offered here so they need not reach below this layer.
export type { LoadedMachine } from '../beamdata/index.js';
export { compareElectronEnergy, DEFAULT_POLICY, ELECTRON_ENERGY_TOLERANCE_PERCENT, type PatientCt, type Policy } from '../check/index.js';
export { STORAGE_CLASSES, type ObjectSummary, readObjectSummary } from '../dicom/index.js';
export { datasetSha256 } from './dataset-hash.js';
export * from './beam-data-template.js';
export { comparePublishedPdd, PUBLISHED_TOLERANCE_PERCENT, type PublishedComparison } from '../beamdata/index.js';
export * from './import-scans.js';
