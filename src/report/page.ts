/**
 * The report page: one self-contained HTML document (inline CSS, inline SVG,
 * images as data: URLs), built as a string by pure functions so it renders
 * the same in Node and in a browser.
 */
import { invertPermutation } from "../symbolic/index.js";
import { binCount, binFactor, binSymmetric, densityPixels } from "./density.js";
import { DENSITY_STOPS, FACTOR_STOPS, palette } from "./colour.js";
import { pngDataUrl } from "./png.js";
import { esc, fmt, matrixPanel, separatorOverlay } from "./svg.js";
import { separatorTreeSvg } from "./tree.js";
import { orderingTable } from "./table.js";
import type { ReportInput } from "./types.js";

const PX = 360;

const CSS = `
:root{--ink:#1d2433;--mute:#5b6576;--line:#dfe4ec;--bg:#f6f8fb;--accent:#2557a3}
*{box-sizing:border-box}body{margin:0;background:var(--bg);color:var(--ink);font:15px/1.5 system-ui,-apple-system,"Segoe UI",Roboto,sans-serif}
main{max-width:1240px;margin:0 auto;padding:28px 28px 48px}
h1{font-size:26px;margin:0 0 2px}h2{font-size:18px;margin:34px 0 10px}
.sub{color:var(--mute);margin:0 0 18px}
.lead{max-width:880px;margin:0 0 14px;color:#3a4456}
.cards{display:flex;flex-wrap:wrap;gap:12px;margin:18px 0}
.card{background:#fff;border:1px solid var(--line);border-radius:10px;padding:10px 16px;min-width:140px}
.card b{display:block;font-size:20px;font-variant-numeric:tabular-nums}.card span{color:var(--mute);font-size:13px}
.panels{display:flex;flex-wrap:wrap;gap:16px}
.panel{margin:0;background:#fff;border:1px solid var(--line);border-radius:10px;padding:10px 10px 12px;flex:1 1 380px;max-width:410px}
.panel svg{display:block;max-width:100%;height:auto}
figcaption{font-size:13px;color:var(--mute);padding:4px 6px 0}figcaption b{color:var(--ink)}
.axis{font-size:11px;fill:#7a8494}.tlabel{font-size:11px;fill:#3a4456}
.zero{fill:#2e9e5b;fill-opacity:.06;stroke:#2e9e5b;stroke-opacity:.85}
.under *{stroke:none!important}.over *{fill:none!important}
.box>svg{display:block;max-width:100%;height:auto}
.tedges line{stroke:#b8c2cf;stroke-width:1.2}
.box{background:#fff;border:1px solid var(--line);border-radius:10px;padding:14px 16px;overflow-x:auto}
table.cmp{border-collapse:collapse;width:100%;font-variant-numeric:tabular-nums;font-size:13.5px}
.cmp th,.cmp td{padding:7px 6px;border-bottom:1px solid var(--line);text-align:left;white-space:nowrap}
.cmp thead th{font-size:12px;color:var(--mute);font-weight:600}
.cmp .num{text-align:right}.cmp .best{font-weight:700}.cmp tr.shown{background:#f2f6fd}
.tag{font-size:11px;font-weight:500;color:var(--accent);border:1px solid #c5d5ef;border-radius:8px;padding:0 6px;margin-left:4px}
.note{color:var(--mute);font-size:13px;margin:8px 0 0}
.thumbs{display:flex;flex-wrap:wrap;gap:14px;margin-top:14px}.thumbs figure{margin:0;font-size:12px;color:var(--mute);text-align:center}.thumbs img{display:block;width:200px;height:200px;image-rendering:pixelated;border:1px solid #334}
.legend{display:flex;flex-wrap:wrap;gap:18px;font-size:13px;color:var(--mute);margin:10px 2px 0}
.legend i{display:inline-block;width:14px;height:10px;border-radius:2px;margin-right:6px;vertical-align:-1px}
footer{margin-top:36px;color:var(--mute);font-size:12px}
`;

/**
 * Render the report as one self-contained HTML document (inline CSS and SVG,
 * images as embedded PNG data URLs, no scripts, no external assets). A pure
 * function of its input with no Node-only imports, so it also runs in a
 * browser. Matrices larger than 400 rows are drawn binned.
 */
export function renderReport(r: ReportInput): string {
  const shown = r.orderings[r.shown];
  const size = binCount(r.n);
  const nnzLowerA = r.lowerColPtr[r.n];
  const blue = palette(DENSITY_STOPS), warm = palette(FACTOR_STOPS);
  const clear = new Uint8Array(256).fill(255);
  clear[0] = 0; // empty cells transparent, so separator bands show through
  const img = (pixels: Uint8Array, pal: Uint8Array) => pngDataUrl(size, size, pixels, pal, clear);
  const aUrl = img(densityPixels(binSymmetric(r.n, r.lowerColPtr, r.lowerRowIdx, null, size)), blue);
  const inverse = shown?.permutation ? invertPermutation(shown.permutation) : null;
  const panels = [matrixPanel({ title: "A as given", caption: `${fmt(r.nnzA)} nonzeros in the file's numbering.`, n: r.n, imageUrl: aUrl, px: PX })];
  if (shown && inverse) {
    const pUrl = img(densityPixels(binSymmetric(r.n, r.lowerColPtr, r.lowerRowIdx, inverse, size)), blue);
    const overlay = shown.separatorTree ? separatorOverlay(shown.separatorTree, r.n, PX, false, 5) : undefined;
    panels.push(matrixPanel({
      title: `P·A·Pᵀ, ${shown.name}`, n: r.n, imageUrl: pUrl, px: PX, overlay,
      caption: shown.separatorTree ? "Coloured bands: separators (numbered last in their subdomain). Dashed green: blocks that are exactly zero between independent subdomains — the arrowhead." : "The same entries, renumbered.",
    }));
  }
  if (shown?.structure) {
    const relabel = inverse && shown.structurePermutation ? compose(inverse, shown.structurePermutation) : null;
    const lUrl = img(densityPixels(binFactor(shown.structure, size, relabel)), warm);
    const overlay = shown.separatorTree ? separatorOverlay(shown.separatorTree, r.n, PX, true, 5) : undefined;
    panels.push(matrixPanel({
      title: `L, ${shown.name}`, n: r.n, imageUrl: lUrl, px: PX, overlay,
      caption: `${fmt(shown.figures.nnzL)} entries (${(shown.figures.nnzL / nnzLowerA).toFixed(1)}× the lower triangle of A). Fill stays inside the bands; the dashed zero blocks stay zero.`,
    }));
  }
  const cards = [
    ["unknowns n", fmt(r.n)], ["nonzeros of A", fmt(r.nnzA)],
    ...(shown ? [["nnz(L), " + shown.name, fmt(shown.figures.nnzL)], ["flops", fmt(shown.figures.flops, true)], ["supernodes", fmt(shown.figures.supernodes)]] : []),
  ].map(([k, v]) => `<div class="card"><b>${v}</b><span>${esc(k)}</span></div>`).join("");
  const tree = shown?.separatorTree && shown.separatorTree.count > 1
    ? `<h2>Separator tree (${shown.name})</h2><div class="box">${separatorTreeSvg(shown.separatorTree, r.n, 1180)}
<p class="note">Each disc is a separator, placed above the middle of the positions its subtree covers (position 1 at the left, n at the right, as along the axes of the pictures above); its area grows with its size, and the number beside it is its size. Grey squares are leaf subdomains. Nodes on different branches share no entries of L, so their factorizations are independent work.</p></div>`
    : "";
  const extra = (r.extraSections ?? []).map((s) => `<h2>${esc(s.title)}</h2><div class="box">${s.html}</div>`).join("\n");
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${esc(r.title)}</title><style>${CSS}</style></head>
<body><main>
<h1>${esc(r.title)}</h1><p class="sub">${esc(r.source)}</p>
<div class="cards">${cards}</div>
<h2>Sparsity patterns</h2>
<p class="lead">A sparse Cholesky factorization computes P·A·Pᵀ = L·Lᵀ, where the permutation P (the ordering) is chosen so that L stays sparse. Nested dissection numbers a small separator last, so the two subdomains it splits never touch: the blocks between them stay exactly zero in L, and their factorizations are independent work.</p>
<div class="panels">${panels.join("\n")}</div>
<div class="legend"><span><i style="background:#6b9ed6"></i>entries of A (darker = denser cell)</span><span><i style="background:#f3944f"></i>entries of L</span><span><i style="background:#2e9e5b;opacity:.5"></i>zero blocks</span><span>${size < r.n ? `Binned to ${size}×${size} cells of ${Math.ceil(r.n / size)}×${Math.ceil(r.n / size)} entries.` : "One cell per entry."}</span></div>
${tree}
${extra}
<h2>Orderings side by side</h2>
<div class="box">${orderingTable(r.orderings, r.shown, nnzLowerA)}${factorThumbnails(r)}</div>
<footer>${r.footer ? esc(r.footer) : "Made by septum."}</footer>
</main></body></html>
`;
}

/** position in the structure's numbering → position in the drawn numbering */
function compose(drawnInverse: Int32Array, structurePermutation: Int32Array): Int32Array {
  const r = new Int32Array(structurePermutation.length);
  for (let k = 0; k < r.length; k++) r[k] = drawnInverse[structurePermutation[k]];
  return r;
}

/** Largest factor drawn as a thumbnail (binning costs one pass over L). */
export const THUMBNAIL_LIMIT = 5e7;

/** The factor of every ordering as a small picture, each in its own structure numbering. */
function factorThumbnails(r: ReportInput): string {
  const warm = palette(FACTOR_STOPS);
  const figures = r.orderings.filter((o) => o.structure && o.figures.nnzL <= THUMBNAIL_LIMIT).map((o) => {
    const st = o.structure!;
    const size = binCount(st.n, 200);
    const url = pngDataUrl(size, size, densityPixels(binFactor(st, size)), warm);
    return `<figure><img src="${url}" alt="factor under ${esc(o.name)}"><figcaption>${esc(o.name)}: ${fmt(o.figures.nnzL)} entries</figcaption></figure>`;
  });
  return figures.length < 2 ? "" : `<p class="note">The factor L under each ordering (same colour scale as above):</p><div class="thumbs">${figures.join("")}</div>`;
}
