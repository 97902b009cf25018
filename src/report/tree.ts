/**
 * The separator tree drawn as a tree: each node sits above the middle of the
 * index range it covers (so the drawing lines up with the matrix panels),
 * one row per depth, disc area proportional to the separator's size; deep
 * subtrees are folded into a small wedge labelled with their node count;
 * small disconnected pieces ordered whole are counted instead of drawn.
 */
import type { SeparatorTree } from "../ordering/types.js";
import { depthColour, esc, fmt, treeChildren, treeDepths } from "./svg.js";

/** SVG of the separator tree, `width` pixels wide, at most maxDepth + 1 rows. */
export function separatorTreeSvg(t: SeparatorTree, n: number, width: number, maxDepth = 6): string {
  const depth = treeDepths(t), ch = treeChildren(t);
  const rowH = 46, top = 22, m = 16;
  let shownDepth = 0;
  for (let i = 0; i < t.count; i++) if (depth[i] <= maxDepth) shownDepth = Math.max(shownDepth, depth[i]);
  const height = top + (shownDepth + 1) * rowH + 10;
  const x = (i: number) => m + (((t.first[i] + t.end[i]) / 2) * (width - 2 * m)) / n;
  const y = (i: number) => top + depth[i] * rowH;
  let maxSep = 1;
  for (let i = 0; i < t.count; i++) maxSep = Math.max(maxSep, t.end[i] - t.separatorFirst[i]);
  const radius = (i: number) => 2.5 + 11 * Math.sqrt((t.end[i] - t.separatorFirst[i]) / maxSep);
  const edges: string[] = [], nodes: string[] = [], folds: string[] = [];
  const subtreeSize = new Int32Array(t.count).fill(1);
  for (let i = 0; i < t.count; i++) if (t.parent[i] >= 0) subtreeSize[t.parent[i]] += subtreeSize[i];
  let small = 0, smallSize = 0;
  for (let i = 0; i < t.count; i++) {
    if (depth[i] > maxDepth) continue;
    if (t.parent[i] < 0 && ch[i].length === 0 && ((t.end[i] - t.first[i]) * (width - 2 * m)) / n < 6) {
      small++; smallSize += t.end[i] - t.first[i]; // a small piece ordered whole: counted, not drawn
      continue;
    }
    if (t.parent[i] >= 0) {
      edges.push(`<line x1="${x(t.parent[i]).toFixed(1)}" y1="${y(t.parent[i])}" x2="${x(i).toFixed(1)}" y2="${y(i)}"/>`);
    }
    const sep = t.end[i] - t.separatorFirst[i];
    const title = `positions ${fmt(t.first[i] + 1)}–${fmt(t.end[i])}, separator ${fmt(sep)}${ch[i].length ? "" : sep > 0 ? " (dense rows, numbered last)" : " (leaf subdomain: minimum degree, or a postorder for a tree)"}`;
    if (sep > 0) {
      nodes.push(`<circle cx="${x(i).toFixed(1)}" cy="${y(i)}" r="${radius(i).toFixed(1)}" fill="${depthColour(depth[i])}"><title>${esc(title)}</title></circle>`);
    } else {
      nodes.push(`<rect x="${(x(i) - 2.5).toFixed(1)}" y="${y(i) - 2.5}" width="5" height="5" fill="#9aa5b1"><title>${esc(title)}</title></rect>`);
    }
    if (depth[i] < 3 && sep > 0 && radius(i) > 6) {
      nodes.push(`<text x="${(x(i) + radius(i) + 3).toFixed(1)}" y="${y(i) + 4}" class="tlabel">${fmt(sep)}</text>`);
    }
    if (depth[i] === maxDepth && ch[i].length > 0) {
      const cx = x(i), cy = y(i) + 8;
      folds.push(`<path d="M${cx.toFixed(1)},${cy} l-6,14 h12 z" fill="#d6dde6"><title>${subtreeSize[i] - 1} more nodes below</title></path>`);
    }
  }
  const note = small > 0 ? `<text x="${m}" y="${height + 8}" class="tlabel">${fmt(small)} small disconnected piece${small === 1 ? "" : "s"} (${fmt(smallSize)} unknowns) not drawn</text>` : "";
  return `<svg viewBox="0 0 ${width} ${height + 14}" width="${width}" height="${height + 14}" role="img" aria-label="separator tree">
<g class="tedges">${edges.join("")}</g>${folds.join("")}${nodes.join("\n")}${note}</svg>`;
}
