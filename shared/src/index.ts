// Public entry of @stavemark/shared: pure computations and request shapes used by api and web.
export * from './schemas/index.js';
export * from './colour/contrast.js';
export * from './music/index.js';
export * from './marks/index.js';
export * from './draw/index.js';
export * from './planning/index.js';
export * from './stats/index.js';
export * from './progress/index.js';
export * from './csv/index.js';
