export * from './distributions.js';
export * from './icc.js';
export * from './kappa.js';
export * from './krippendorff.js';
export * from './severity.js';
export * from './interpretation.js';
