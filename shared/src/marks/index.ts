export * from './rounding.js';
export * from './bands.js';
export * from './scoring.js';
export * from './moderation.js';
