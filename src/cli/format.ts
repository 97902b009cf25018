/** Plain-text formatting for the terminal: numbers, durations, aligned tables. */

/** 1234567 → "1 234 567"; large values in k/M/G with three significant digits when `short`. */
export function num(x: number, short = false): string {
  if (!Number.isFinite(x)) return "–";
  if (short && Math.abs(x) >= 1e4) {
    const [d, s] = Math.abs(x) >= 1e9 ? [1e9, "G"] : Math.abs(x) >= 1e6 ? [1e6, "M"] : [1e3, "k"];
    return `${(x / d).toPrecision(3)} ${s}`;
  }
  return Math.round(x).toString().replace(/\B(?=(\d{3})+(?!\d))/g, " ");
}

/** Seconds with a sensible unit. */
export function secs(x: number): string {
  return x < 0.01 ? `${(x * 1000).toFixed(1)} ms` : `${x.toFixed(x < 10 ? 3 : 1)} s`;
}

/** Scientific notation with two significant digits. */
export function sci(x: number): string {
  return x === 0 ? "0" : x.toExponential(1);
}

/** Columns aligned: text columns left, the rest right. */
export function table(header: string[], rows: string[][], leftColumns = 1): string {
  const w = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (r: string[]) => r.map((v, c) => (c < leftColumns ? v.padEnd(w[c]) : v.padStart(w[c]))).join("  ").trimEnd();
  return [line(header), w.map((x) => "─".repeat(x)).join("  "), ...rows.map(line)].join("\n") + "\n";
}
