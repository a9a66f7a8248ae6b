export { main, usage, VERSION } from './main.js';
export type { CliIO } from './io.js';
