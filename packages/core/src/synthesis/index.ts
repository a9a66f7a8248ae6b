export * from './encoding.js';
export * from './types.js';
