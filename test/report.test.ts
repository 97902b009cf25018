import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { crc32 as zlibCrc32, inflateSync } from "node:zlib";
import { adler32, base64, crc32, encodePalettePng, zlibStored } from "../src/report/png.js";
import { binCount, binFactor, binSymmetric, densityPixels } from "../src/report/density.js";
import { separatorOverlay } from "../src/report/svg.js";
import { separatorTreeSvg } from "../src/report/tree.js";
import { renderReport } from "../src/report/page.js";
import { fieldSvg, rasterizeField } from "../src/report/field.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import type { SeparatorTree } from "../src/ordering/types.js";
import type { SupernodalStructure } from "../src/symbolic/types.js";

/** PNG chunks (type, data) of a PNG file, checking each CRC with node:zlib's crc32 (an outside implementation). */
function chunks(png: Uint8Array): { type: string; data: Uint8Array }[] {
  // PNG signature: W3C PNG specification §5.2
  expect(Array.from(png.subarray(0, 8))).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  const out: { type: string; data: Uint8Array }[] = [];
  const v = new DataView(png.buffer, png.byteOffset, png.byteLength);
  for (let o = 8; o < png.length;) {
    const len = v.getUint32(o);
    const type = String.fromCharCode(...png.subarray(o + 4, o + 8));
    expect(v.getUint32(o + 8 + len)).toBe(zlibCrc32(png.subarray(o + 4, o + 8 + len)));
    out.push({ type, data: png.subarray(o + 8, o + 8 + len) });
    o += 12 + len;
  }
  return out;
}

describe("PNG encoder", () => {
  it("CRC-32 and Adler-32 agree with published check values", () => {
    // check values for the ASCII string "123456789": CRC-32 0xCBF43926 (common practice, the CRC catalogue), Adler-32 0x091E01DE (RFC 1950 algorithm; from memory)
    const s = new TextEncoder().encode("123456789");
    expect(crc32(s)).toBe(0xcbf43926);
    expect(adler32(s)).toBe(0x091e01de);
  });

  it("stored zlib streams inflate back with node:zlib for any bytes (property)", () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 200_000 }), (data) => {
      expect(Buffer.compare(inflateSync(zlibStored(data)), Buffer.from(data))).toBe(0);
    }), { numRuns: 20 });
  });

  it("palette PNG: chunk order, CRCs, IHDR fields and pixel rows read back", () => {
    const w = 7, h = 5;
    const pixels = Uint8Array.from({ length: w * h }, (_, i) => (i * 37) % 256);
    const pal = Uint8Array.from({ length: 768 }, (_, i) => i % 256);
    const alpha = new Uint8Array(256).fill(255);
    const c = chunks(encodePalettePng(w, h, pixels, pal, alpha));
    expect(c.map((x) => x.type)).toEqual(["IHDR", "PLTE", "tRNS", "IDAT", "IEND"]);
    const ihdr = new DataView(c[0].data.buffer, c[0].data.byteOffset, 13);
    expect([ihdr.getUint32(0), ihdr.getUint32(4), c[0].data[8], c[0].data[9]]).toEqual([w, h, 8, 3]);
    const raw = inflateSync(c[3].data);
    for (let y = 0; y < h; y++) {
      expect(raw[y * (w + 1)]).toBe(0); // filter type none
      expect(Array.from(raw.subarray(y * (w + 1) + 1, (y + 1) * (w + 1)))).toEqual(Array.from(pixels.subarray(y * w, (y + 1) * w)));
    }
  });

  it("base64 matches Node's Buffer encoding (property)", () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 3000 }), (d) => {
      expect(base64(d)).toBe(Buffer.from(d).toString("base64"));
    }));
  });
});

/** Random symmetric pattern: lower triangle of a random matrix plus the diagonal. */
const lowerPattern = fc.integer({ min: 1, max: 40 }).chain((n) =>
  fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 })), { maxLength: 3 * n }).map((pairs) => {
    const rows = [], cols = [], vals = [];
    for (let i = 0; i < n; i++) { rows.push(i); cols.push(i); vals.push(1); }
    for (const [a, b] of pairs) { rows.push(Math.max(a, b)); cols.push(Math.min(a, b)); vals.push(1); }
    return SparseMatrix.fromTriplets(n, n, rows, cols, vals);
  }));

describe("density binning", () => {
  it("at full resolution a cell is coloured exactly when the entry of P·A·Pᵀ is nonzero (property, dense check via toDense)", () => {
    fc.assert(fc.property(lowerPattern, fc.integer(), (L, seed) => {
      const n = L.ncols;
      const perm = Array.from({ length: n }, (_, i) => i);
      let s = seed >>> 0;
      for (let i = n - 1; i > 0; i--) { s = (s * 1103515245 + 12345) >>> 0; const j = s % (i + 1); [perm[i], perm[j]] = [perm[j], perm[i]]; }
      const inv = new Int32Array(n);
      perm.forEach((old, k) => (inv[old] = k));
      const px = densityPixels(binSymmetric(n, L.colPtr, L.rowIdx, inv, n));
      const D = L.toDense();
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
        const a = perm[i], b = perm[j];
        const nz = D[Math.max(a, b)][Math.min(a, b)] !== 0;
        expect(px[i * n + j] > 0).toBe(nz);
      }
    }), { numRuns: 60 });
  });

  it("binned counts add up to the nonzeros of the full symmetric matrix", () => {
    fc.assert(fc.property(lowerPattern, fc.integer({ min: 1, max: 9 }), (L, size) => {
      const n = L.ncols;
      const b = binSymmetric(n, L.colPtr, L.rowIdx, null, Math.min(size, n));
      let diag = 0;
      for (let j = 0; j < n; j++) for (let p = L.colPtr[j]; p < L.colPtr[j + 1]; p++) if (L.rowIdx[p] === j) diag++;
      expect(b.counts.reduce((x, y) => x + y, 0)).toBe(2 * L.nnz - diag);
    }));
    expect(binCount(10)).toBe(10);
    expect(binCount(1e6)).toBe(400);
  });

  it("factor binning covers every stored entry of a hand-made supernodal structure once", () => {
    // L of tridiag(-1,2,-1), n = 4: one supernode per column, rows {j, j+1} (standard result: bidiagonal Cholesky factor)
    const st: SupernodalStructure = {
      n: 4, supernodeCount: 4, superStart: Int32Array.from([0, 1, 2, 3, 4]), superParent: Int32Array.from([1, 2, 3, -1]),
      rowPtr: Int32Array.from([0, 2, 4, 6, 7]), rowIdx: Int32Array.from([0, 1, 1, 2, 2, 3, 3]),
      factorPtr: Float64Array.from([0, 2, 4, 6, 7]), columnSupernode: Int32Array.from([0, 1, 2, 3]),
    };
    const b = binFactor(st, 4);
    const expected = [1, 0, 0, 0, 1, 1, 0, 0, 0, 1, 1, 0, 0, 0, 1, 1];
    expect(Array.from(b.counts)).toEqual(expected);
    // relabelled by the reversal k → 3 − k the bidiagonal lands in the upper triangle, drawn mirrored into the lower one
    const r = binFactor(st, 4, Int32Array.from([3, 2, 1, 0]));
    expect(Array.from(r.counts)).toEqual(expected);
  });
});

/** A two-level dissection of 7 positions: children [0,3) and [3,6), separator {6}. */
const tree: SeparatorTree = {
  count: 3, first: Int32Array.from([0, 3, 0]), separatorFirst: Int32Array.from([3, 6, 6]),
  end: Int32Array.from([3, 6, 7]), parent: Int32Array.from([2, 2, -1]),
};

describe("separator drawings", () => {
  it("outline the zero block between the two subdomains and the separator band", () => {
    const svg = separatorOverlay(tree, 7, 700, false, 5);
    // the zero block rows 3..5 × columns 0..2 and its mirror
    expect(svg).toContain('x="0" y="3" width="3" height="3" class="zero"');
    expect(svg).toContain('x="3" y="0" width="3" height="3" class="zero"');
    // the separator band: row 6 across columns 0..6
    expect(svg).toMatch(/x="0" y="6" width="7" height="1"/);
    const lower = separatorOverlay(tree, 7, 700, true, 5);
    expect(lower).not.toContain('x="3" y="0"');
  });

  it("counts small disconnected pieces instead of drawing them", () => {
    // three one-vertex components and one big leaf component of a 1000-vertex graph
    const pieces: SeparatorTree = {
      count: 4, first: Int32Array.from([0, 1, 2, 3]), separatorFirst: Int32Array.from([1, 2, 3, 1000]),
      end: Int32Array.from([1, 2, 3, 1000]), parent: Int32Array.from([-1, -1, -1, -1]),
    };
    const svg = separatorTreeSvg(pieces, 1000, 600);
    expect(svg).toContain("3 small disconnected pieces (3 unknowns) not drawn");
    expect((svg.match(/<rect/g) ?? []).length).toBe(1);
  });

  it("draws one disc per separator and one square per leaf", () => {
    const svg = separatorTreeSvg(tree, 7, 600);
    expect((svg.match(/<circle/g) ?? []).length).toBe(1);
    expect((svg.match(/<rect/g) ?? []).length).toBe(2);
    expect((svg.match(/<line/g) ?? []).length).toBe(2);
  });
});

describe("report page", () => {
  it("is one self-contained document: no external references, escaped title, every section", () => {
    const L = SparseMatrix.fromTriplets(7, 7, [0, 1, 2, 3, 4, 5, 6, 1, 2, 4, 5, 6, 6], [0, 1, 2, 3, 4, 5, 6, 0, 1, 3, 4, 2, 5], new Array(13).fill(1));
    const html = renderReport({
      title: "<A & B>", source: "test", n: 7, lowerColPtr: L.colPtr, lowerRowIdx: L.rowIdx, nnzA: 19, shown: 0,
      orderings: [
        { name: "nested-dissection", permutation: Int32Array.from([0, 1, 2, 3, 4, 5, 6]), separatorTree: tree, figures: { nnzL: 15, flops: 35, supernodes: 3 } },
        { name: "natural", figures: { nnzL: 16, flops: 40, supernodes: 4 } },
      ],
    });
    expect(html.startsWith("<!doctype html>")).toBe(true);
    expect(html).toContain("&lt;A &amp; B&gt;");
    expect(html).not.toMatch(/(src|href)="(https?:)?\/\//);
    expect(html).not.toContain("<script");
    expect(html).toContain("data:image/png;base64,");
    expect(html).toContain("Separator tree");
    expect(html).toContain("natural");
  });
});

describe("field picture", () => {
  it("rasterizes a linear field exactly at pixel centres and leaves the outside transparent", () => {
    // two triangles covering [0,1]×[0,0.5]; u = x is linear, so interpolation is exact (P1 contains linears)
    const coords = Float64Array.from([0, 0, 1, 0, 1, 0.5, 0, 0.5]);
    const triangles = Int32Array.from([0, 1, 2, 0, 2, 3]);
    const values = Float64Array.from([0, 1, 1, 0]);
    const pix = rasterizeField({ coords, triangles, values, width: 1, height: 1, title: "", unit: "" }, 10, 10, 0, 1);
    for (let px = 0; px < 10; px++) {
      expect(pix[9 * 10 + px]).toBe(1 + Math.round(254 * (px + 0.5) / 10)); // bottom row, inside
      expect(pix[0 * 10 + px]).toBe(0); // top row, outside the mesh
    }
    const svg = fieldSvg({ coords, triangles, values, width: 1, height: 0.5, title: "t", unit: "°C" });
    expect(svg).toContain("<svg");
    expect(svg).toContain("linearGradient");
  });
});
