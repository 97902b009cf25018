/**
 * One updating progress line on a terminal's stderr: drawn only when stderr
 * is a TTY, --quiet is off and the work has run for more than `delay`
 * seconds; redrawn at most ten times a second; erased when done.
 */
import type { CliIO } from "./io.js";

export interface ProgressLine {
  update(label: string, fraction: number): void;
  done(): void;
}

export function progressLine(io: CliIO, enabled: boolean, delay = 0.8): ProgressLine {
  const start = io.now();
  let last = -1, drawn = false;
  return {
    update(label, fraction) {
      if (!enabled) return;
      const t = io.now();
      if (t - start < delay || t - last < 0.1) return;
      last = t;
      const f = Math.min(1, Math.max(0, fraction));
      const width = 24, full = Math.round(f * width);
      const bar = "█".repeat(full) + "░".repeat(width - full);
      io.stderr(`\r\x1b[K  ${label.padEnd(10)} ${bar} ${(100 * f).toFixed(0).padStart(3)}%  ${(t - start).toFixed(1)} s`);
      drawn = true;
    },
    done() {
      if (drawn) io.stderr("\r\x1b[K");
      drawn = false;
    },
  };
}
