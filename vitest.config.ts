import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
    resolve: {
        alias: {
            '@detent/core': here('./packages/core/src/index.ts'),
            '@detent/language': here('./packages/language/src/index.ts'),
            '@detent/cli': here('./packages/cli/src/index.ts'),
        },
    },
    test: {
        include: ['packages/*/test/**/*.test.ts', 'tests/**/*.test.ts', 'server/test/**/*.test.ts', 'client/test/**/*.test.ts'],
        exclude: ['**/node_modules/**', 'tests/e2e/**'],
        testTimeout: 60_000,
        pool: 'forks',
    },
});
