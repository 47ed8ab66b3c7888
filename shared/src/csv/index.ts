export * from './neutralise.js';
