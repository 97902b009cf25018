// CPUs allowed by a Linux cgroup quota, from the control files' contents.
// Reference for the formats: the Linux kernel documentation,
// admin-guide/cgroup-v2 ("cpu.max": "$MAX $PERIOD", "max" for no limit) and
// scheduler/sched-bwc (cgroup v1 "cpu.cfs_quota_us", -1 for no limit, and
// "cpu.cfs_period_us"); from memory.
import { readFileSync } from "node:fs";
import { availableParallelism } from "node:os";
import { describe, expect, it } from "vitest";
import { quotaCores, type ReadText } from "../src/ordering/nested-dissection/cores.js";
import { availableCores } from "../src/ordering/nested-dissection/threads.js";

/** A reader over a fixed set of files. */
const files = (entries: Record<string, string>): ReadText => (path) => entries[path] ?? null;

describe("cgroup CPU quota", () => {
  it("reads cgroup v2 cpu.max of the process's own group, whole CPUs, at least one", () => {
    const own = "0::/\n";
    expect(quotaCores(files({ "/proc/self/cgroup": own, "/sys/fs/cgroup/cpu.max": "200000 100000\n" }))).toBe(2);
    expect(quotaCores(files({ "/proc/self/cgroup": own, "/sys/fs/cgroup/cpu.max": "150000 100000\n" }))).toBe(1);
    expect(quotaCores(files({ "/proc/self/cgroup": own, "/sys/fs/cgroup/cpu.max": "50000 100000\n" }))).toBe(1);
    expect(quotaCores(files({ "/proc/self/cgroup": own, "/sys/fs/cgroup/cpu.max": "max 100000\n" }))).toBeNull();
    const nested = "0::/system.slice/app.service\n";
    expect(quotaCores(files({
      "/proc/self/cgroup": nested,
      "/sys/fs/cgroup/system.slice/app.service/cpu.max": "400000 100000",
      "/sys/fs/cgroup/cpu.max": "100000 100000",
    }))).toBe(4);
  });

  it("falls back to cgroup v1 quota and period; no files or no limit means no cap", () => {
    const v1 = (quota: string) => files({ "/sys/fs/cgroup/cpu/cpu.cfs_quota_us": quota, "/sys/fs/cgroup/cpu/cpu.cfs_period_us": "100000\n" });
    expect(quotaCores(v1("300000\n"))).toBe(3);
    expect(quotaCores(v1("-1\n"))).toBeNull();
    expect(quotaCores(files({}))).toBeNull();
    expect(quotaCores(files({ "/sys/fs/cgroup/cpu.max": "garbage" }))).toBeNull();
  });

  it("caps Node's core count by this machine's quota for the default number of threads", () => {
    const read: ReadText = (path) => { try { return readFileSync(path, "utf8"); } catch { return null; } };
    const quota = quotaCores(read);
    expect(availableCores()).toBe(Math.min(availableParallelism(), quota ?? Infinity));
  });
});
