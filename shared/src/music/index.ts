export * from './domain.js';
export * from './notes.js';
export * from './fingering.js';
export * from './noteValues.js';
export * from './keys.js';
export * from './schemas.js';
