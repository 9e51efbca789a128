export * from './vector.js';
export * from './beam-frame.js';
export * from './flat-depth.js';
export * from './aperture.js';
export * from './ray-trace.js';
export * from './ct-depth.js';
export * from './dose-at-point.js';
export * from './body-mask.js';
