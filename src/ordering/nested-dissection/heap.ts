/**
 * Indexed binary max-heap over vertex ids with integer keys (Williams 1964,
 * "Algorithm 232: Heapsort", CACM 7(6)), supporting update and removal of an
 * arbitrary member: the priority queue of the greedy growing and the
 * Fiduccia–Mattheyses passes. Storage is allocated once for `capacity` ids.
 */
export class MaxHeap {
  readonly heap: Int32Array;
  readonly key: Int32Array;
  readonly pos: Int32Array;
  size = 0;
  constructor(capacity: number) {
    this.heap = new Int32Array(capacity);
    this.key = new Int32Array(capacity);
    this.pos = new Int32Array(capacity).fill(-1);
  }
  has(v: number): boolean { return this.pos[v] >= 0; }
  top(): number { return this.heap[0]; }
  topKey(): number { return this.key[this.heap[0]]; }
  clear(): void {
    for (let i = 0; i < this.size; i++) this.pos[this.heap[i]] = -1;
    this.size = 0;
  }
  push(v: number, k: number): void {
    this.key[v] = k;
    this.heap[this.size] = v;
    this.pos[v] = this.size;
    this.up(this.size++);
  }
  update(v: number, k: number): void {
    const old = this.key[v];
    this.key[v] = k;
    if (k > old) this.up(this.pos[v]); else this.down(this.pos[v]);
  }
  remove(v: number): void {
    const i = this.pos[v];
    if (i < 0) return;
    this.pos[v] = -1;
    const last = this.heap[--this.size];
    if (i === this.size) return;
    this.heap[i] = last;
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
    const { heap, key, pos } = this;
    const v = heap[i];
    const k = key[v];
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (key[heap[p]] >= k) break;
      heap[i] = heap[p]; pos[heap[i]] = i; i = p;
    }
    heap[i] = v; pos[v] = i;
  }
  private down(i: number): void {
    const { heap, key, pos } = this;
    const n = this.size;
    const v = heap[i];
    const k = key[v];
    for (;;) {
      let c = 2 * i + 1;
      if (c >= n) break;
      if (c + 1 < n && key[heap[c + 1]] > key[heap[c]]) c++;
      if (key[heap[c]] <= k) break;
      heap[i] = heap[c]; pos[heap[i]] = i; i = c;
    }
    heap[i] = v; pos[v] = i;
  }
}
