/**
 * The orderings side by side: one row per ordering, the best value of each
 * column in bold, and bars for nnz(L) and flops on a shared logarithmic axis
 * so a 100× gap reads as a 100× gap.
 */
import { esc, fmt } from "./svg.js";
import type { ReportOrdering } from "./types.js";

function bar(value: number, lo: number, hi: number, colour: string): string {
  const span = Math.log10(hi) - Math.log10(lo) || 1;
  const w = 6 + 74 * ((Math.log10(value) - Math.log10(lo)) / span);
  return `<svg width="82" height="10" class="bar"><rect width="${w.toFixed(1)}" height="10" rx="2" fill="${colour}"/></svg>`;
}

function bytes(b: number | undefined): string {
  return b === undefined ? "–" : b < 2 ** 20 ? `${(b / 1024).toFixed(1)} kB` : `${(b / 2 ** 20).toFixed(1)} MiB`;
}

function secs(x: number | undefined): string {
  return x === undefined ? "–" : x < 0.01 ? `${(x * 1000).toFixed(1)} ms` : `${x.toFixed(2)} s`;
}

/** HTML table comparing orderings; `shown` marks the one drawn in detail. */
export function orderingTable(list: readonly ReportOrdering[], shown: number, nnzLowerA: number): string {
  const best = (f: (o: ReportOrdering) => number | undefined) =>
    Math.min(...list.map((o) => f(o) ?? Infinity));
  const bNnz = best((o) => o.figures.nnzL), bFl = best((o) => o.figures.flops), bSn = best((o) => o.figures.supernodes);
  const hiNnz = Math.max(...list.map((o) => o.figures.nnzL)), hiFl = Math.max(...list.map((o) => o.figures.flops));
  const loNnz = Math.min(nnzLowerA, bNnz), loFl = Math.max(1, bFl / 2);
  const hasFactor = list.some((o) => o.figures.factorSeconds !== undefined);
  const cell = (v: number, b: number, text: string) => `<td class="num${v === b ? " best" : ""}">${text}</td>`;
  const rows = list.map((o, i) => {
    const f = o.figures;
    return `<tr${i === shown ? ' class="shown"' : ""}><th>${esc(o.name)}${i === shown ? ' <span class="tag">drawn above</span>' : ""}</th>
${cell(f.nnzL, bNnz, fmt(f.nnzL))}<td>${bar(f.nnzL, loNnz, hiNnz, "#f3944f")}</td>
<td class="num">${(f.nnzL / nnzLowerA).toFixed(1)}×</td>
${cell(f.flops, bFl, fmt(f.flops, true))}<td>${bar(f.flops, loFl, hiFl, "#2557a3")}</td>
<td class="num">${f.flops === bFl ? "1" : (f.flops / bFl).toFixed(1)}×</td>
${cell(f.supernodes, bSn, fmt(f.supernodes))}
<td class="num">${bytes(f.factorBytes)}</td>
<td class="num">${secs(f.orderingSeconds)}</td><td class="num">${secs(f.analyzeSeconds)}</td>${hasFactor ? `<td class="num">${secs(f.factorSeconds)}</td>` : ""}</tr>`;
  });
  return `<table class="cmp"><thead><tr><th>ordering</th><th class="num">nnz(L)</th><th></th><th class="num">fill</th>
<th class="num">flops</th><th></th><th class="num">vs best</th><th class="num">supernodes</th><th class="num">factor</th>
<th class="num">ordering</th><th class="num">analysis</th>${hasFactor ? '<th class="num">factorization</th>' : ""}</tr></thead>
<tbody>${rows.join("\n")}</tbody></table>
<p class="note">fill = nnz(L) / nnz(lower triangle of A); flops = Σ c<sub>j</sub><sup>2</sup> over columns of L (c<sub>j</sub> entries incl. the diagonal); bars on a log scale; best of each column in bold.</p>`;
}
