/**
 * Triangle meshes of a rectangular plate with circular holes.
 *
 * Method: a structured background triangulation (squares split along
 * alternating diagonals) cut by the level set of the holes, in the spirit of
 * isosurface stuffing (Labelle & Shewchuk 2007, "Isosurface stuffing: fast
 * tetrahedral meshes with good dihedral angles", ACM TOG 26(3)) reduced to two
 * dimensions: nodes close to a circle are snapped onto it, triangles that
 * straddle a circle are cut at the edge/circle intersections, triangles inside
 * a hole are dropped. Every node on a hole boundary lies exactly on its circle.
 */
import { InputError } from "../errors.js";

/** A circular hole: centre (x, y) and radius r. */
export interface Hole {
  readonly x: number;
  readonly y: number;
  readonly r: number;
}

/** A rectangle [0, width] × [0, height] with circular holes, meshed at spacing h. */
export interface PlateSpec {
  readonly width: number;
  readonly height: number;
  readonly holes: readonly Hole[];
  readonly h: number;
}

/** Linear triangles: node i at (coords[2i], coords[2i+1]); triangle t is triangles[3t..3t+3), counter-clockwise. */
export interface TriangleMesh {
  readonly nodeCount: number;
  readonly coords: Float64Array;
  readonly triangles: Int32Array;
  /** For each node: index of the hole whose circle it lies on, or -1. */
  readonly holeOf: Int32Array;
}

const SNAP = 0.3; // nodes within SNAP·h of a circle move onto it

/** Mesh a plate with holes; throws InputError for holes that leave the plate or overlap. */
export function meshPlate(spec: PlateSpec): TriangleMesh {
  checkSpec(spec);
  const nx = Math.max(1, Math.round(spec.width / spec.h));
  const ny = Math.max(1, Math.round(spec.height / spec.h));
  const grid = backgroundGrid(spec, nx, ny);
  snapNodes(spec, grid, Math.min(spec.width / nx, spec.height / ny));
  return cutTriangles(spec, grid, nx, ny);
}

function checkSpec(spec: PlateSpec): void {
  const { width, height, h, holes } = spec;
  if (!(width > 0 && height > 0 && h > 0 && isFinite(width) && isFinite(height))) {
    throw new InputError(`plate: width, height and h must be positive (got ${width}, ${height}, ${h})`);
  }
  for (let k = 0; k < holes.length; k++) {
    const o = holes[k];
    if (!(o.r >= h)) throw new InputError(`plate: hole ${k + 1} radius ${o.r} must be at least h = ${h}`);
    const margin = Math.min(o.x, o.y, width - o.x, height - o.y) - o.r;
    if (margin < h) throw new InputError(`plate: hole ${k + 1} lies closer than h to the rim`);
    for (let m = 0; m < k; m++) {
      const p = holes[m];
      if (Math.hypot(o.x - p.x, o.y - p.y) - o.r - p.r < 2 * h) {
        throw new InputError(`plate: holes ${m + 1} and ${k + 1} are closer than 2h`);
      }
    }
  }
}

interface Grid {
  x: number[];
  y: number[];
  /** signed distance to the nearest circle (positive in the material); 0 once snapped */
  phi: number[];
  hole: number[];
}

function backgroundGrid(spec: PlateSpec, nx: number, ny: number): Grid {
  const g: Grid = { x: [], y: [], phi: [], hole: [] };
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const x = (spec.width * i) / nx;
      const y = (spec.height * j) / ny;
      let best = Infinity;
      let which = -1;
      for (let k = 0; k < spec.holes.length; k++) {
        const o = spec.holes[k];
        const d = Math.hypot(x - o.x, y - o.y) - o.r;
        if (d < best) { best = d; which = k; }
      }
      g.x.push(x); g.y.push(y); g.phi.push(best); g.hole.push(which);
    }
  }
  return g;
}

function snapNodes(spec: PlateSpec, g: Grid, h: number): void {
  for (let v = 0; v < g.x.length; v++) {
    if (g.hole[v] < 0 || Math.abs(g.phi[v]) >= SNAP * h) continue;
    const o = spec.holes[g.hole[v]];
    const dx = g.x[v] - o.x;
    const dy = g.y[v] - o.y;
    const len = Math.hypot(dx, dy);
    g.x[v] = o.x + (o.r * dx) / len;
    g.y[v] = o.y + (o.r * dy) / len;
    g.phi[v] = 0;
  }
}

/** Point where segment a→b (a outside, b inside hole k) crosses the circle; memoized per edge. */
function cutPoint(spec: PlateSpec, g: Grid, cuts: Map<number, number>, a: number, b: number, stride: number): number {
  const key = Math.min(a, b) * stride + Math.max(a, b);
  const known = cuts.get(key);
  if (known !== undefined) return known;
  const o = spec.holes[g.hole[b]];
  const ex = g.x[b] - g.x[a], ey = g.y[b] - g.y[a];
  const fx = g.x[a] - o.x, fy = g.y[a] - o.y;
  const qa = ex * ex + ey * ey, qb = 2 * (fx * ex + fy * ey), qc = fx * fx + fy * fy - o.r * o.r;
  const t = (-qb - Math.sqrt(Math.max(0, qb * qb - 4 * qa * qc))) / (2 * qa);
  const id = g.x.length;
  g.x.push(g.x[a] + t * ex); g.y.push(g.y[a] + t * ey); g.phi.push(0); g.hole.push(g.hole[b]);
  cuts.set(key, id);
  return id;
}

function cutTriangles(spec: PlateSpec, g: Grid, nx: number, ny: number): TriangleMesh {
  const tris: number[] = [];
  const cuts = new Map<number, number>();
  const stride = (nx + 1) * (ny + 1);
  const sign = (v: number): number => (g.phi[v] > 0 ? 1 : g.phi[v] < 0 ? -1 : 0);
  const emit = (poly: number[]): void => {
    if (poly.length === 3) { tris.push(poly[0], poly[1], poly[2]); return; }
    // quadrilateral: split along the shorter diagonal
    const d02 = Math.hypot(g.x[poly[0]] - g.x[poly[2]], g.y[poly[0]] - g.y[poly[2]]);
    const d13 = Math.hypot(g.x[poly[1]] - g.x[poly[3]], g.y[poly[1]] - g.y[poly[3]]);
    if (d02 <= d13) tris.push(poly[0], poly[1], poly[2], poly[0], poly[2], poly[3]);
    else tris.push(poly[0], poly[1], poly[3], poly[1], poly[2], poly[3]);
  };
  const handle = (a: number, b: number, c: number): void => {
    if (sign(a) > 0 && sign(b) > 0 && sign(c) > 0) { tris.push(a, b, c); return; } // the common case, without the arrays below
    const v = [a, b, c];
    const s = [sign(a), sign(b), sign(c)];
    const neg = s.filter((q) => q < 0).length;
    const pos = s.filter((q) => q > 0).length;
    if (neg === 0) {
      if (pos > 0 || centroidInMaterial(spec, g, a, b, c)) emit(v);
      return;
    }
    if (pos === 0) return;
    const poly: number[] = [];
    for (let e = 0; e < 3; e++) {
      const p = v[e], q = v[(e + 1) % 3];
      if (s[e] >= 0) poly.push(p);
      if (s[e] * s[(e + 1) % 3] < 0) poly.push(s[e] > 0 ? cutPoint(spec, g, cuts, p, q, stride) : cutPoint(spec, g, cuts, q, p, stride));
    }
    emit(poly);
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const v00 = j * (nx + 1) + i, v10 = v00 + 1, v01 = v00 + nx + 1, v11 = v01 + 1;
      if ((i + j) % 2 === 0) { handle(v00, v10, v11); handle(v00, v11, v01); }
      else { handle(v00, v10, v01); handle(v10, v11, v01); }
    }
  }
  return compact(g, tris);
}

function centroidInMaterial(spec: PlateSpec, g: Grid, a: number, b: number, c: number): boolean {
  const x = (g.x[a] + g.x[b] + g.x[c]) / 3, y = (g.y[a] + g.y[b] + g.y[c]) / 3;
  return spec.holes.every((o) => Math.hypot(x - o.x, y - o.y) > o.r);
}

/** Drop nodes no triangle uses and renumber the rest in their original order. */
function compact(g: Grid, tris: number[]): TriangleMesh {
  const newId = new Int32Array(g.x.length).fill(-1);
  for (const v of tris) newId[v] = 0;
  let count = 0;
  for (let v = 0; v < newId.length; v++) if (newId[v] === 0) newId[v] = count++;
  const coords = new Float64Array(2 * count);
  const holeOf = new Int32Array(count);
  for (let v = 0; v < newId.length; v++) {
    const w = newId[v];
    if (w < 0) continue;
    coords[2 * w] = g.x[v];
    coords[2 * w + 1] = g.y[v];
    holeOf[w] = g.phi[v] === 0 ? g.hole[v] : -1;
  }
  const triangles = new Int32Array(tris.length);
  for (let t = 0; t < tris.length; t++) triangles[t] = newId[tris[t]];
  return { nodeCount: count, coords, triangles, holeOf };
}
