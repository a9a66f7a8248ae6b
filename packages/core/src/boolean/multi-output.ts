export interface MultiFunction { readonly on: readonly import('./cube.js').Cube[]; readonly dc: readonly import('./cube.js').Cube[] }
export interface MultiResult { readonly covers: import('./cube.js').Cube[][] }
export function minimizeMulti(): MultiResult { return { covers: [] }; }
