export * from './vector.js';
export * from './beam-frame.js';
export * from './flat-depth.js';
export * from './aperture.js';
