export { importPlanBytes, importPlanFile, type ImportedPlan, type ReadPlanOptions } from './read-plan-file.js';
export { parseDicomBytes } from './parse-bytes.js';
export { RT_PLAN_STORAGE } from './rt-plan/read-rt-plan.js';
export { readCtSeries, readCtVolumes, CT_IMAGE_STORAGE } from './ct-series.js';
export { readRtDose, RT_DOSE_STORAGE } from './rt-dose.js';
export { readRtStruct, RT_STRUCTURE_SET_STORAGE } from './rt-struct.js';
export { readObjectSummary, STORAGE_CLASSES, type ObjectKind, type ObjectSummary } from './object-summary.js';
export { SOP_CLASS_NAMES } from './dictionary.js';
export { datasetOffset } from './dataset-offset.js';
