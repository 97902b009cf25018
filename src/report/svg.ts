/**
 * SVG building blocks for the report: escaping, a matrix panel (density image
 * plus frame and axis labels) and the overlays that outline a dissection's
 * separator bands and the zero blocks between independent subdomains.
 */
import type { SeparatorTree } from "../ordering/types.js";

/** Escape text for HTML/SVG content and attribute values. */
export function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** A number with thin grouping, e.g. 1 234 567, or with a k/M/G suffix when `short`. */
export function fmt(x: number, short = false): string {
  if (!isFinite(x)) return "–";
  if (short) {
    const a = Math.abs(x);
    if (a >= 1e9) return `${(x / 1e9).toPrecision(3)} G`;
    if (a >= 1e6) return `${(x / 1e6).toPrecision(3)} M`;
    if (a >= 1e4) return `${(x / 1e3).toPrecision(3)} k`;
  }
  return Math.round(x).toString().replace(/\B(?=(\d{3})+(?!\d))/g, "\u2009");
}

/** Depth of every node (roots 0); parents are listed after their children. */
export function treeDepths(t: SeparatorTree): Int32Array {
  const d = new Int32Array(t.count);
  for (let i = t.count - 1; i >= 0; i--) d[i] = t.parent[i] < 0 ? 0 : d[t.parent[i]] + 1;
  return d;
}

/** Children lists of the separator tree, each sorted by position. */
export function treeChildren(t: SeparatorTree): number[][] {
  const ch: number[][] = Array.from({ length: t.count }, () => []);
  for (let i = 0; i < t.count; i++) if (t.parent[i] >= 0) ch[t.parent[i]].push(i);
  for (const c of ch) c.sort((a, b) => t.first[a] - t.first[b]);
  return ch;
}

/** Colour of separator-tree depth d (shared by the overlays and the tree). */
export function depthColour(d: number): string {
  const palette = ["#d1495b", "#edae49", "#00798c", "#8d6cab", "#30638e", "#66a182", "#b5651d", "#6b7b8c"];
  return palette[d % palette.length];
}

export interface PanelOptions {
  readonly title: string;
  readonly caption: string;
  readonly n: number;
  readonly imageUrl: string;
  /**
   * SVG in matrix coordinates (0..n on both axes), drawn twice: its fills
   * beneath the (transparent-background) image, its outlines above it.
   */
  readonly overlay?: string;
  readonly px?: number;
}

/** One matrix picture: the density image (empty cells transparent) in a frame with index labels. */
export function matrixPanel(o: PanelOptions): string {
  const px = o.px ?? 360, m = 22, ml = 12 + 6.5 * fmt(o.n).length;
  const s = px / o.n;
  return `<figure class="panel">
<svg viewBox="0 0 ${px + ml + 8} ${px + m + 8}" width="${px + ml + 8}" height="${px + m + 8}" role="img" aria-label="${esc(o.title)}">
<text x="${ml}" y="${m - 7}" class="axis">1</text><text x="${px + ml}" y="${m - 7}" class="axis" text-anchor="end">${fmt(o.n)}</text>
<text x="${ml - 5}" y="${m + 10}" class="axis" text-anchor="end">1</text><text x="${ml - 5}" y="${px + m}" class="axis" text-anchor="end">${fmt(o.n)}</text>
<g transform="translate(${ml},${m})">
<rect width="${px}" height="${px}" fill="#fff"/>
${o.overlay ? `<g transform="scale(${s})" class="under">${o.overlay}</g>` : ""}
<image href="${o.imageUrl}" width="${px}" height="${px}" preserveAspectRatio="none" style="image-rendering:pixelated"/>
${o.overlay ? `<g transform="scale(${s})" class="over">${o.overlay}</g>` : ""}
<rect width="${px}" height="${px}" fill="none" stroke="#334" stroke-width="1"/>
</g></svg>
<figcaption><b>${esc(o.title)}</b><br>${o.caption}</figcaption></figure>`;
}

/**
 * Outlines for P·A·Pᵀ (both triangles) or L (lower only): translucent bands on
 * each separator's rows and columns, dashed boxes on the zero blocks between
 * sibling subdomains (top four levels). Only nodes at depth ≤ maxDepth spanning at least six
 * pixels of a px-wide panel are drawn.
 */
export function separatorOverlay(t: SeparatorTree, n: number, px: number, lowerOnly: boolean, maxDepth: number): string {
  const depth = treeDepths(t), ch = treeChildren(t);
  const sw = (1.2 * n) / px; // stroke width ≈ 1.2 screen pixels
  const minSpan = (6 * n) / px; // nothing narrower than 6 pixels
  const parts: string[] = [];
  for (let i = 0; i < t.count; i++) {
    const f = t.first[i], sf = t.separatorFirst[i], e = t.end[i];
    if (depth[i] > maxDepth || e - f < minSpan) continue;
    const col = depthColour(depth[i]);
    const kids = ch[i];
    for (let a = 0; a < kids.length && depth[i] <= 3; a++) for (let b = a + 1; b < kids.length; b++) {
      const A = kids[a], B = kids[b];
      const box = (x: number, y: number, w: number, h: number) =>
        `<rect x="${x}" y="${y}" width="${w}" height="${h}" class="zero" stroke-width="${sw}" stroke-dasharray="${3 * sw} ${2 * sw}"/>`;
      // block rows B × columns A lies below the diagonal
      parts.push(box(t.first[A], t.first[B], t.end[A] - t.first[A], t.end[B] - t.first[B]));
      if (!lowerOnly) parts.push(box(t.first[B], t.first[A], t.end[B] - t.first[B], t.end[A] - t.first[A]));
    }
    if (e > sf) {
      // a band at least 1.5 pixels thick, so small separators stay visible
      const t = Math.max(e - sf, 1.5 * (n / px)), s0 = e - t;
      parts.push(`<rect x="${f}" y="${s0}" width="${e - f}" height="${t}" fill="${col}" fill-opacity="0.35" stroke="${col}" stroke-width="${sw}"/>`);
      if (!lowerOnly) parts.push(`<rect x="${s0}" y="${f}" width="${t}" height="${s0 - f}" fill="${col}" fill-opacity="0.35" stroke="${col}" stroke-width="${sw}"/>`);
    }
  }
  return parts.join("\n");
}
