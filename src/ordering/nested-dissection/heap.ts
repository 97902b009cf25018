/**
 * Indexed binary max-heap over vertex ids with integer keys (Williams 1964,
 * "Algorithm 232: Heapsort", CACM 7(6)), supporting update and removal of an
 * arbitrary member: the priority queue of the greedy growing and the
 * Fiduccia–Mattheyses passes. Storage is allocated once for `capacity` ids.
 * The keys are also kept by heap position, so sifting compares without
 * looking up the vertex first.
 */
export class MaxHeap {
  readonly heap: Int32Array;
  /** Key of each vertex. */
  readonly key: Int32Array;
  /** Key of the vertex at each heap position (a copy of key[heap[i]]). */
  private readonly heapKey: Int32Array;
  readonly pos: Int32Array;
  size = 0;
  constructor(capacity: number) {
    this.heap = new Int32Array(capacity);
    this.key = new Int32Array(capacity);
    this.heapKey = new Int32Array(capacity);
    this.pos = new Int32Array(capacity).fill(-1);
  }
  has(v: number): boolean { return this.pos[v] >= 0; }
  top(): number { return this.heap[0]; }
  topKey(): number { return this.heapKey[0]; }
  clear(): void {
    for (let i = 0; i < this.size; i++) this.pos[this.heap[i]] = -1;
    this.size = 0;
  }
  push(v: number, k: number): void {
    this.key[v] = k;
    this.heap[this.size] = v;
    this.heapKey[this.size] = k;
    this.pos[v] = this.size;
    this.up(this.size++);
  }
  update(v: number, k: number): void {
    const old = this.key[v];
    const i = this.pos[v];
    this.key[v] = k;
    this.heapKey[i] = k;
    if (k > old) this.up(i); else this.down(i);
  }
  remove(v: number): void {
    const i = this.pos[v];
    if (i < 0) return;
    this.pos[v] = -1;
    const last = this.heap[--this.size];
    if (i === this.size) return;
    this.heap[i] = last;
    this.heapKey[i] = this.heapKey[this.size];
    this.pos[last] = i;
    this.up(i);
    this.down(this.pos[last]);
  }
  pop(): number {
    const v = this.heap[0];
    this.remove(v);
    return v;
  }
  private up(i: number): void {
    const { heap, heapKey, pos } = this;
    const v = heap[i];
    const k = heapKey[i];
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (heapKey[p] >= k) break;
      const u = heap[p];
      heap[i] = u; heapKey[i] = heapKey[p]; pos[u] = i; i = p;
    }
    heap[i] = v; heapKey[i] = k; pos[v] = i;
  }
  private down(i: number): void {
    const { heap, heapKey, pos } = this;
    const n = this.size;
    const v = heap[i];
    const k = heapKey[i];
    for (;;) {
      let c = 2 * i + 1;
      if (c >= n) break;
      let kc = heapKey[c];
      if (c + 1 < n && heapKey[c + 1] > kc) kc = heapKey[++c];
      if (kc <= k) break;
      const u = heap[c];
      heap[i] = u; heapKey[i] = kc; pos[u] = i; i = c;
    }
    heap[i] = v; heapKey[i] = k; pos[v] = i;
  }
}
