// Extension-host tests in the style of @vscode/test-electron need a VS Code (Electron) build,
// which that package downloads from Microsoft's update service at test time. This machine and CI
// reach only the npm registry and Debian's archive, so the download cannot happen; the real VS Code
// host test runs in code-server instead (vscode-host.e2e.mjs). This module only detects whether an
// Electron host could run here and says why not.
import { existsSync, readdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';

/** Returns `{ runnable: false, reason }` unless both the runner package and a cached VS Code build are present. */
export function detectElectronHost(root) {
    const require = createRequire(join(root, 'package.json'));
    let runner = true;
    try {
        require.resolve('@vscode/test-electron');
    } catch {
        runner = false;
    }
    const cache = join(root, '.vscode-test');
    const cached = existsSync(cache) && readdirSync(cache).some((d) => d.startsWith('vscode-'));
    if (runner && cached) return { runnable: true, reason: `cached VS Code in ${cache}` };
    const why = [];
    if (!runner) why.push('@vscode/test-electron is not installed (it downloads VS Code from the update service, which is unreachable here: only the npm registry and apt are)');
    if (!cached) why.push(`no cached VS Code build in ${cache}`);
    return { runnable: false, reason: why.join('; ') };
}
