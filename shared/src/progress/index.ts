export * from './trend.js';
export * from './issues.js';
export * from './attention.js';
