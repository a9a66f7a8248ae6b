export * from './encoding.js';
export * from './types.js';
export * from './equation-text.js';
export * from './kmap.js';
