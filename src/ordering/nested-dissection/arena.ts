/**
 * Bump allocator over one Int32Array, reset for every bisection: the levels of
 * a coarsening hierarchy live only while one piece is being cut, so their
 * arrays are carved from storage allocated once for the top graph instead of
 * being allocated (and collected) per level and per piece. Requests beyond the
 * capacity fall back to fresh arrays, so the arena only ever saves work.
 */
export class Int32Arena {
  private readonly buffer: Int32Array;
  private top = 0;
  constructor(capacity: number) {
    this.buffer = new Int32Array(capacity);
  }
  /** Forgets every array handed out so far. */
  reset(): void {
    this.top = 0;
  }
  /** An array of `length` entries with unspecified contents. */
  take(length: number): Int32Array {
    if (this.top + length > this.buffer.length) return new Int32Array(length);
    const a = this.buffer.subarray(this.top, this.top + length);
    this.top += length;
    return a;
  }
  /**
   * Shrinks the most recently taken array `a` to its first `used` entries,
   * returning the rest to the arena; `a` must be the last array taken.
   */
  trim(a: Int32Array, used: number): Int32Array {
    if (a.buffer === this.buffer.buffer && a.byteOffset + a.byteLength === this.buffer.byteOffset + 4 * this.top) {
      this.top -= a.length - used;
    }
    return a.subarray(0, used);
  }
}

/** The arenas of one hierarchy: vertex-sized arrays, adjacency and edge weights. */
export interface HierarchyArenas {
  vertices: Int32Arena;
  adjacency: Int32Arena;
  edgeWeights: Int32Arena;
}

/**
 * Arenas for hierarchies of a graph with n vertices and m adjacency entries.
 * Levels shrink by about half on meshes, so all levels but the smallest fit
 * (those few fall back to fresh arrays).
 */
export function hierarchyArenas(n: number, m: number): HierarchyArenas {
  const edges = Math.ceil(1.5 * m) + 64;
  return { vertices: new Int32Arena(8 * n + 64), adjacency: new Int32Arena(edges), edgeWeights: new Int32Arena(edges) };
}

/** Resets all three arenas. */
export function resetArenas(a: HierarchyArenas): void {
  a.vertices.reset(); a.adjacency.reset(); a.edgeWeights.reset();
}
