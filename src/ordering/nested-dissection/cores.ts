/**
 * CPUs a Linux control group lets the process use. Node's core count (libuv's
 * available parallelism, as of Node 20) follows the CPU affinity mask but not
 * a cgroup CPU quota, so in a container limited to 2 CPUs on a 32-core host
 * it reports 32; helper threads beyond the quota only compete for it (four
 * threads on this 2-core machine ordered the 1000² grid 30–40 % slower than
 * two). Formats (Linux kernel documentation, admin-guide/cgroup-v2 and
 * cgroup-v1/cfs; from memory): v2 `cpu.max` holds "$MAX $PERIOD" with "max"
 * for no limit; v1 holds `cpu.cfs_quota_us` (-1 for no limit) and
 * `cpu.cfs_period_us`. The process's own group is the "0::" line of
 * /proc/self/cgroup (v2); inside a container that is usually "/".
 */

/** Reads a small text file; null when it is missing or unreadable. */
export type ReadText = (path: string) => string | null;

/** Whole CPUs of the quota (at least 1), or null when no quota is set or none can be read. */
export function quotaCores(read: ReadText): number | null {
  const own = ownGroup(read("/proc/self/cgroup"));
  for (const dir of own === null ? ["/sys/fs/cgroup"] : [`/sys/fs/cgroup${own}`, "/sys/fs/cgroup"]) {
    const max = read(`${dir.replace(/\/$/, "")}/cpu.max`);
    if (max !== null) {
      const [quota, period] = max.trim().split(/\s+/);
      return cores(Number(quota), Number(period));
    }
  }
  const quota = read("/sys/fs/cgroup/cpu/cpu.cfs_quota_us");
  const period = read("/sys/fs/cgroup/cpu/cpu.cfs_period_us");
  return quota === null || period === null ? null : cores(Number(quota), Number(period));
}

/** The v2 group path from /proc/self/cgroup ("0::/path"), or null. */
function ownGroup(text: string | null): string | null {
  if (text === null) return null;
  for (const line of text.split("\n")) if (line.startsWith("0::/")) return line.slice(3).trim();
  return null;
}

/** Whole CPUs of quota/period, at least 1; null for "max", -1 or anything unreadable. */
function cores(quota: number, period: number): number | null {
  if (!(quota > 0 && period > 0)) return null;
  return Math.max(1, Math.floor(quota / period));
}
