export * from './csv-table.js';
export * from './table-lookup.js';
export * from './manifest-schema.js';
export * from './load-machine.js';
export * from './validate-tables.js';
export * from './find-beam.js';
export * from './manifest-json-schema.js';
export * from './density-table.js';
