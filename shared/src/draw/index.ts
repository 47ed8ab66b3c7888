export * from './prng.js';
export * from './draw.js';
