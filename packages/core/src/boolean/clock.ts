/**
 * The minimizer's clock: CPU time of this process in milliseconds where Node provides it, so
 * that a budget measures work done, not how busy the machine is (on a loaded CI runner a
 * wall-clock budget would cut the exact search short at random). Falls back to wall time.
 *
 * Reading CPU time is a system call, so it is refreshed at most every 16 wall milliseconds;
 * in between, elapsed wall time is added (an over-estimate of CPU time — deadlines come a
 * little early, never late).
 */
const hasCpuUsage = typeof process !== 'undefined' && typeof process.cpuUsage === 'function';
let lastWall = -Infinity;
let lastCpu = 0;

export function cpuNow(): number {
    const wall = performance.now();
    if (!hasCpuUsage) return wall;
    if (wall - lastWall < 16) return lastCpu + (wall - lastWall);
    const u = process.cpuUsage();
    lastWall = wall;
    lastCpu = (u.user + u.system) / 1000;
    return lastCpu;
}
