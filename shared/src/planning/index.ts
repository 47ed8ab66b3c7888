export * from './slots.js';
