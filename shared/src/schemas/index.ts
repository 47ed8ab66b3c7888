export * from './roles.js';
export * from './auth.js';
export * from './users.js';
export * from './errors.js';
export * from './rubrics.js';
export * from './requirement-lists.js';
export * from './fingerings.js';
export * from './sittings.js';
