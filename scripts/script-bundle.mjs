// esbuild options shared by the scripts that run TypeScript sources directly (run-ts.mjs, fuzz.mjs):
// workspace packages resolve to their src/ index, external packages stay imports resolved from the
// repository's node_modules (so the bundle must be written below it, e.g. node_modules/.cache).
import { join } from 'node:path';

export function scriptBundleOptions(root) {
    return {
        bundle: true,
        platform: 'node',
        target: 'node20',
        format: 'esm',
        logLevel: 'warning',
        packages: 'external',
        alias: {
            '@detent/core': join(root, 'packages/core/src/index.ts'),
            '@detent/language': join(root, 'packages/language/src/index.ts'),
            '@detent/cli': join(root, 'packages/cli/src/index.ts'),
        },
        nodePaths: [join(root, 'node_modules')],
    };
}
