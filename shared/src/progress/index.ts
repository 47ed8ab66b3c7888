export * from './trend.js';
export * from './issues.js';
