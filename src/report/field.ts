/**
 * A scalar field on a triangle mesh drawn as a picture: the piecewise-linear
 * field rasterized (barycentric interpolation per pixel) into a palette PNG,
 * wrapped in SVG with the domain outline, optional marked rectangles and
 * circles, and a colour bar with ticks.
 */
import { HEAT_STOPS, hex, palette } from "./colour.js";
import { pngDataUrl } from "./png.js";
import { esc } from "./svg.js";

export interface FieldPicture {
  /** node coordinates (x, y) pairs */
  readonly coords: Float64Array;
  /** three node indices per triangle */
  readonly triangles: Int32Array;
  /** one value per node */
  readonly values: Float64Array;
  /** the rectangle [0, width] × [0, height] in model units */
  readonly width: number;
  readonly height: number;
  readonly title: string;
  /** unit of the values, e.g. "°C" */
  readonly unit: string;
  /** rectangles to outline (x, y, w, h in model units) with labels */
  readonly boxes?: readonly { x: number; y: number; w: number; h: number; label?: string }[];
  /** circles to outline (holes) */
  readonly circles?: readonly { x: number; y: number; r: number }[];
  /** picture width in pixels (default 720) */
  readonly px?: number;
}

/** Rasterize the field: palette indices, 0 outside every triangle. */
export function rasterizeField(f: FieldPicture, w: number, h: number, lo: number, hi: number): Uint8Array {
  const pix = new Uint8Array(w * h);
  const sx = w / f.width, sy = h / f.height, span = hi > lo ? hi - lo : 1;
  const xy = f.coords, T = f.triangles;
  for (let t = 0; t < T.length; t += 3) {
    const a = T[t], b = T[t + 1], c = T[t + 2];
    const ax = xy[2 * a] * sx, ay = (f.height - xy[2 * a + 1]) * sy;
    const bx = xy[2 * b] * sx, by = (f.height - xy[2 * b + 1]) * sy;
    const cx = xy[2 * c] * sx, cy = (f.height - xy[2 * c + 1]) * sy;
    const det = (bx - ax) * (cy - ay) - (cx - ax) * (by - ay);
    if (det === 0) continue;
    const x0 = Math.max(0, Math.floor(Math.min(ax, bx, cx))), x1 = Math.min(w - 1, Math.ceil(Math.max(ax, bx, cx)));
    const y0 = Math.max(0, Math.floor(Math.min(ay, by, cy))), y1 = Math.min(h - 1, Math.ceil(Math.max(ay, by, cy)));
    for (let py = y0; py <= y1; py++) {
      for (let px = x0; px <= x1; px++) {
        const qx = px + 0.5, qy = py + 0.5;
        const l1 = ((qx - ax) * (cy - ay) - (cx - ax) * (qy - ay)) / det;
        const l2 = ((bx - ax) * (qy - ay) - (qx - ax) * (by - ay)) / det;
        const l0 = 1 - l1 - l2;
        if (l0 < -1e-9 || l1 < -1e-9 || l2 < -1e-9) continue;
        const v = l0 * f.values[a] + l1 * f.values[b] + l2 * f.values[c];
        pix[py * w + px] = 1 + Math.round(254 * Math.min(1, Math.max(0, (v - lo) / span)));
      }
    }
  }
  return pix;
}

/** Round tick values covering [lo, hi]. */
function ticks(lo: number, hi: number): number[] {
  const raw = (hi - lo) / 5 || 1;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? raw;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9 * step; v += step) out.push(+v.toPrecision(12));
  return out;
}

/** The complete SVG picture (self-contained). */
export function fieldSvg(f: FieldPicture): string {
  let lo = Infinity, hi = -Infinity;
  for (const v of f.values) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
  const W = f.px ?? 720, H = Math.round((W * f.height) / f.width);
  const pal = palette(HEAT_STOPS, [255, 255, 255]);
  const alpha = new Uint8Array(256).fill(255); alpha[0] = 0;
  const url = pngDataUrl(W, H, rasterizeField(f, W, H, lo, hi), pal, alpha);
  const m = 12, top = 34, barX = m + W + 28, barH = H;
  const X = (x: number) => m + (x * W) / f.width, Y = (y: number) => top + ((f.height - y) * H) / f.height;
  const S = W / f.width;
  const boxes = (f.boxes ?? []).map((b) => `<rect x="${X(b.x).toFixed(1)}" y="${Y(b.y + b.h).toFixed(1)}" width="${(b.w * S).toFixed(1)}" height="${(b.h * S).toFixed(1)}" fill="none" stroke="#fff" stroke-opacity=".75" stroke-dasharray="5 4"/>` +
    (b.label ? `<text x="${(X(b.x) + 5).toFixed(1)}" y="${(Y(b.y + b.h) + 14).toFixed(1)}" class="flabel">${esc(b.label)}</text>` : "")).join("");
  const circles = (f.circles ?? []).map((c) => `<circle cx="${X(c.x).toFixed(1)}" cy="${Y(c.y).toFixed(1)}" r="${(c.r * S).toFixed(1)}" fill="#eef2f7" stroke="#3a4456" stroke-width="1.2"/>`).join("");
  const stops = HEAT_STOPS.map((c, i) => `<stop offset="${(1 - i / (HEAT_STOPS.length - 1)).toFixed(3)}" stop-color="${hex(c)}"/>`).reverse().join("");
  const tickMarks = ticks(lo, hi).map((v) => {
    const y = top + barH * (1 - (v - lo) / (hi - lo || 1));
    return `<line x1="${barX + 16}" x2="${barX + 21}" y1="${y.toFixed(1)}" y2="${y.toFixed(1)}" stroke="#3a4456"/><text x="${barX + 25}" y="${(y + 4).toFixed(1)}" class="ftick">${+v.toFixed(2)}</text>`;
  }).join("");
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${barX + 90} ${top + H + 16}" width="${barX + 90}" height="${top + H + 16}" font-family="system-ui,sans-serif">
<style>.flabel{font-size:11px;fill:#fff}.ftick{font-size:11px;fill:#3a4456}.ftitle{font-size:14px;font-weight:600;fill:#1d2433}</style>
<defs><linearGradient id="heatbar" x1="0" y1="0" x2="0" y2="1">${stops}</linearGradient></defs>
<text x="${m}" y="20" class="ftitle">${esc(f.title)}</text>
<rect x="${m}" y="${top}" width="${W}" height="${H}" fill="#eef2f7"/>
<image href="${url}" x="${m}" y="${top}" width="${W}" height="${H}"/>
${circles}${boxes}
<rect x="${m}" y="${top}" width="${W}" height="${H}" fill="none" stroke="#3a4456" stroke-width="1.2"/>
<rect x="${barX}" y="${top}" width="16" height="${barH}" fill="url(#heatbar)" stroke="#3a4456" stroke-width=".8"/>${tickMarks}
<text x="${barX}" y="${top - 8}" class="ftick">${esc(f.unit)}</text>
</svg>`;
}
