/**
 * Byte form of an Analysis: a 32-byte header (8-byte tag "SEPTUM-A", format
 * version, FNV-1a checksum of the body, reserved zeros) followed by the body: the figures,
 * then every array as a length-prefixed little-endian run. Decoding checks
 * the tag, version, checksum and every length before reading, then the
 * structural invariants, so corrupted or foreign bytes give a FormatError,
 * never a malformed Analysis.
 */
import { FormatError } from "../errors.js";
import { childLists } from "../symbolic/etree.js";
import type { SeparatorTree } from "../ordering/types.js";
import type { AnalysisParts } from "./analysis.js";
import type { AnalysisStats } from "./stats.js";

const TAG = "SEPTUM-A";
const VERSION = 1;
const STAT_KEYS = [
  "n", "nnzA", "nnzL", "flops", "supernodes", "largestSupernode", "largestFront",
  "factorBytes", "peakBytes", "orderingSeconds", "symbolicSeconds",
] as const;

/** Growing little-endian writer. */
class Writer {
  private buf = new Uint8Array(1024);
  private view = new DataView(this.buf.buffer);
  length = 0;
  private room(bytes: number): void {
    if (this.length + bytes <= this.buf.length) return;
    const next = new Uint8Array(Math.max(this.buf.length * 2, this.length + bytes));
    next.set(this.buf.subarray(0, this.length));
    this.buf = next;
    this.view = new DataView(next.buffer);
  }
  u32(v: number): void { this.room(4); this.view.setUint32(this.length, v, true); this.length += 4; }
  f64(v: number): void { this.room(8); this.view.setFloat64(this.length, v, true); this.length += 8; }
  ints(a: Int32Array): void {
    this.u32(a.length); this.room(4 * a.length);
    for (let k = 0; k < a.length; k++, this.length += 4) this.view.setInt32(this.length, a[k], true);
  }
  doubles(a: Float64Array): void {
    this.u32(a.length); this.room(8 * a.length);
    for (let k = 0; k < a.length; k++, this.length += 8) this.view.setFloat64(this.length, a[k], true);
  }
  text(s: string): void {
    const b = new TextEncoder().encode(s);
    this.u32(b.length); this.room(b.length); this.buf.set(b, this.length); this.length += b.length;
  }
  bytes(): Uint8Array { return this.buf.slice(0, this.length); }
}

/** Bounds-checked little-endian reader. */
class Reader {
  private readonly view: DataView;
  offset: number;
  constructor(private readonly b: Uint8Array, offset: number) {
    this.view = new DataView(b.buffer, b.byteOffset, b.byteLength);
    this.offset = offset;
  }
  private need(bytes: number, what: string): void {
    if (this.offset + bytes > this.b.length) throw new FormatError(`analysis bytes are truncated while reading ${what}`);
  }
  u32(what: string): number { this.need(4, what); const v = this.view.getUint32(this.offset, true); this.offset += 4; return v; }
  f64(what: string): number { this.need(8, what); const v = this.view.getFloat64(this.offset, true); this.offset += 8; return v; }
  ints(what: string): Int32Array {
    const n = this.u32(what); this.need(4 * n, what);
    const a = new Int32Array(n);
    for (let k = 0; k < n; k++, this.offset += 4) a[k] = this.view.getInt32(this.offset, true);
    return a;
  }
  doubles(what: string): Float64Array {
    const n = this.u32(what); this.need(8 * n, what);
    const a = new Float64Array(n);
    for (let k = 0; k < n; k++, this.offset += 8) a[k] = this.view.getFloat64(this.offset, true);
    return a;
  }
  text(what: string): string {
    const n = this.u32(what); this.need(n, what);
    const s = new TextDecoder().decode(this.b.subarray(this.offset, this.offset + n));
    this.offset += n;
    return s;
  }
  done(): boolean { return this.offset === this.b.length; }
}

/** FNV-1a over bytes (32-bit). */
function checksum(b: Uint8Array, from: number): number {
  let h = 0x811c9dc5;
  for (let k = from; k < b.length; k++) h = Math.imul(h ^ b[k], 0x01000193);
  return h >>> 0;
}

/** Encode the parts of an Analysis. */
export function encodeAnalysis(a: AnalysisParts): Uint8Array {
  const w = new Writer();
  for (let k = 0; k < 8; k++) w.u32(0); // header, filled in below
  for (const key of STAT_KEYS) w.f64(a.stats[key]);
  w.text(a.stats.ordering);
  w.ints(a.permutation);
  w.ints(a.orderingPermutation);
  w.ints(a.eliminationTree);
  w.ints(a.columnCounts);
  const st = a.structure;
  w.ints(st.superStart); w.ints(st.superParent); w.ints(st.rowPtr); w.ints(st.rowIdx); w.doubles(st.factorPtr);
  const t = a.separatorTree;
  w.u32(t ? 1 : 0);
  if (t) { w.ints(t.first); w.ints(t.separatorFirst); w.ints(t.end); w.ints(t.parent); }
  const out = w.bytes();
  const view = new DataView(out.buffer);
  for (let k = 0; k < 8; k++) out[k] = TAG.charCodeAt(k);
  view.setUint32(8, VERSION, true);
  view.setUint32(12, checksum(out, 32), true);
  return out;
}

/** Decode and validate; FormatError on anything that is not an Analysis of this version. */
export function decodeAnalysis(bytes: Uint8Array): AnalysisParts {
  if (!(bytes instanceof Uint8Array)) throw new FormatError("analysis bytes must be a Uint8Array");
  if (bytes.length < 32) throw new FormatError(`${bytes.length} bytes are too few to be a serialized analysis`);
  for (let k = 0; k < 8; k++) {
    if (bytes[k] !== TAG.charCodeAt(k)) throw new FormatError("these bytes are not a serialized septum analysis (tag mismatch)");
  }
  const head = new DataView(bytes.buffer, bytes.byteOffset, 16);
  const version = head.getUint32(8, true);
  if (version !== VERSION) throw new FormatError(`analysis format version ${version} is not supported (this build reads version ${VERSION})`);
  if (head.getUint32(12, true) !== checksum(bytes, 32)) throw new FormatError("analysis bytes are corrupted (checksum mismatch)");
  const r = new Reader(bytes, 32);
  const stats: Record<string, number | string> = {};
  for (const key of STAT_KEYS) stats[key] = r.f64(key);
  stats.ordering = r.text("ordering name");
  const permutation = r.ints("permutation");
  const orderingPermutation = r.ints("ordering permutation");
  const eliminationTree = r.ints("elimination tree");
  const columnCounts = r.ints("column counts");
  const superStart = r.ints("supernode starts"), superParent = r.ints("supernode parents");
  const rowPtr = r.ints("row pointers"), rowIdx = r.ints("row indices"), factorPtr = r.doubles("factor offsets");
  let separatorTree: SeparatorTree | undefined;
  const hasTree = r.u32("separator tree flag");
  if (hasTree === 1) {
    const first = r.ints("tree"), separatorFirst = r.ints("tree"), end = r.ints("tree"), parent = r.ints("tree");
    separatorTree = { count: first.length, first, separatorFirst, end, parent };
  } else if (hasTree !== 0) throw new FormatError("analysis bytes are corrupted (separator tree flag)");
  if (!r.done()) throw new FormatError("analysis bytes have trailing data");
  const n = permutation.length;
  const inversePermutation = checkPermutation(permutation, "permutation");
  checkPermutation(orderingPermutation, "ordering permutation");
  const ns = superParent.length;
  const columnSupernode = new Int32Array(n);
  checkStructure(n, ns, superStart, superParent, rowPtr, rowIdx, factorPtr, columnSupernode);
  if (eliminationTree.length !== n || columnCounts.length !== n || stats.n !== n) {
    throw new FormatError("analysis bytes are inconsistent (array lengths disagree with n)");
  }
  if (separatorTree) checkTree(n, separatorTree);
  return {
    permutation, inversePermutation, orderingPermutation, separatorTree, eliminationTree, columnCounts,
    structure: { n, supernodeCount: ns, superStart, superParent, rowPtr, rowIdx, factorPtr, columnSupernode },
    stats: stats as unknown as AnalysisStats,
  };
}

function checkPermutation(p: Int32Array, what: string): Int32Array {
  const inv = new Int32Array(p.length).fill(-1);
  for (let k = 0; k < p.length; k++) {
    const v = p[k];
    if (v < 0 || v >= p.length || inv[v] !== -1) throw new FormatError(`analysis bytes are corrupted (${what} is not a permutation)`);
    inv[v] = k;
  }
  return inv;
}

function checkStructure(
  n: number, ns: number, superStart: Int32Array, superParent: Int32Array, rowPtr: Int32Array,
  rowIdx: Int32Array, factorPtr: Float64Array, columnSupernode: Int32Array,
): void {
  const bad = (why: string): never => { throw new FormatError(`analysis bytes are corrupted (${why})`); };
  if (superStart.length !== ns + 1 || rowPtr.length !== ns + 1 || factorPtr.length !== ns + 1) bad("supernode array lengths");
  if (superStart[0] !== 0 || superStart[ns] !== n || rowPtr[0] !== 0 || rowPtr[ns] !== rowIdx.length || factorPtr[0] !== 0) bad("supernode bounds");
  for (let s = 0; s < ns; s++) {
    const f = superStart[s], l = superStart[s + 1], r0 = rowPtr[s], r1 = rowPtr[s + 1];
    if (l <= f || r1 - r0 < l - f) bad(`supernode ${s} extent`);
    if (superParent[s] !== -1 && (superParent[s] <= s || superParent[s] >= ns)) bad(`supernode ${s} parent`);
    if (factorPtr[s + 1] !== factorPtr[s] + (r1 - r0) * (l - f)) bad(`supernode ${s} factor offset`);
    for (let q = r0; q < r1; q++) {
      const i = rowIdx[q];
      if (i >= n || (q < r0 + (l - f) ? i !== f + (q - r0) : i <= rowIdx[q - 1])) bad(`supernode ${s} rows`);
    }
    columnSupernode.fill(s, f, l);
  }
  checkNesting(n, ns, superStart, superParent, rowPtr, rowIdx, bad);
}

/**
 * Every supernode's rows below its columns must start inside its parent's
 * columns and all be rows of its parent (a root has none): the extend-add of
 * the numeric phase relies on it. One pass per parent with a row marker.
 */
function checkNesting(
  n: number, ns: number, superStart: Int32Array, superParent: Int32Array, rowPtr: Int32Array, rowIdx: Int32Array,
  bad: (why: string) => never,
): void {
  const { childPtr: childStart, children } = childLists(superParent);
  const marker = new Int32Array(n).fill(-1);
  for (let p = 0; p < ns; p++) {
    for (let q = rowPtr[p]; q < rowPtr[p + 1]; q++) marker[rowIdx[q]] = p;
    for (let c = childStart[p]; c < childStart[p + 1]; c++) {
      const s = children[c];
      const below = rowPtr[s] + (superStart[s + 1] - superStart[s]);
      if (below < rowPtr[s + 1] && rowIdx[below] >= superStart[p + 1]) bad(`supernode ${s} does not meet its parent`);
      for (let q = below; q < rowPtr[s + 1]; q++) if (marker[rowIdx[q]] !== p) bad(`supernode ${s} rows outside its parent`);
    }
  }
  for (let s = 0; s < ns; s++) {
    if (superParent[s] === -1 && rowPtr[s + 1] - rowPtr[s] !== superStart[s + 1] - superStart[s]) bad(`root supernode ${s} rows`);
  }
}

function checkTree(n: number, t: SeparatorTree): void {
  const { count, first, separatorFirst, end, parent } = t;
  if (separatorFirst.length !== count || end.length !== count || parent.length !== count) {
    throw new FormatError("analysis bytes are corrupted (separator tree lengths)");
  }
  for (let i = 0; i < count; i++) {
    if (!(0 <= first[i] && first[i] <= separatorFirst[i] && separatorFirst[i] <= end[i] && end[i] <= n)
      || parent[i] < -1 || parent[i] >= count) {
      throw new FormatError(`analysis bytes are corrupted (separator tree node ${i})`);
    }
  }
}
