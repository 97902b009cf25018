/**
 * Approximate minimum degree, part 1 (Amestoy, Davis & Duff 1996, SIAM J.
 * Matrix Anal. Appl. 17(4)): turn the pivot variable into a new element whose
 * clique Lme is the union of its adjacent variables and of the cliques of its
 * adjacent elements (which are absorbed), then compute for every element e
 * that touches Lme the weighted size of Le \ Lme, which the degree update needs.
 */
import { bucketRemove, compact, Field, type MdWorkspace } from "./workspace.js";

/** The pivot's new clique lies in arena[first .. end); its weighted size is cliqueWeight. */
export interface NewElement {
  first: number;
  end: number;
  cliqueWeight: number;
}

/** Gather Lme for pivot `me` (already out of its bucket and flagged with negative weight). */
export function buildElement(s: MdWorkspace, me: number, out: NewElement): void {
  const node = s.node;
  const bme = me * Field.Count;
  if (node[bme + Field.Elements] === 0) buildInPlace(s, me, out);
  else buildFromElements(s, me, out);
  node[bme + Field.Start] = out.end > out.first ? out.first : -1;
  node[bme + Field.Size] = out.end - out.first;
  node[bme + Field.Elements] = 0;
}

/** No adjacent elements: Lme is the pivot's own variable list, filtered in place. */
function buildInPlace(s: MdWorkspace, me: number, out: NewElement): void {
  const { arena, node } = s;
  const first = node[me * Field.Count + Field.Start];
  const stop = first + node[me * Field.Count + Field.Size];
  let dst = first;
  let total = 0;
  for (let p = first; p < stop; p++) {
    const i = arena[p];
    const bi = i * Field.Count;
    const w = node[bi + Field.Weight];
    if (w <= 0) continue;
    total += w;
    node[bi + Field.Weight] = -w;
    arena[dst++] = i;
    if (i < s.firstHalo) bucketRemove(s, i);
  }
  out.first = first;
  out.end = dst;
  out.cliqueWeight = total;
}

/** Lme is built at the free end of the arena, absorbing each adjacent element. */
function buildFromElements(s: MdWorkspace, me: number, out: NewElement): void {
  const node = s.node;
  const bme = me * Field.Count;
  const elements = node[bme + Field.Elements];
  let arena = s.arena;
  let free = s.free;
  let first = free;
  let total = 0;
  let p = node[bme + Field.Start];
  let pStop = p + node[bme + Field.Size];
  for (let k = 0; k <= elements; k++) {
    const e = k < elements ? arena[p++] : me;
    const be = e * Field.Count;
    let q = e === me ? p : node[be + Field.Start];
    let qStop = e === me ? pStop : q + node[be + Field.Size];
    while (q < qStop) {
      const i = arena[q++];
      const bi = i * Field.Count;
      const w = node[bi + Field.Weight];
      if (w <= 0) continue;
      if (free >= arena.length) {
        // Save both cursors as the remaining lists, compact, and reload them.
        if (e !== me) saveList(s, e, q, qStop);
        saveList(s, me, e === me ? q : p, pStop);
        s.free = free;
        first = compact(s, first, s.n);
        arena = s.arena;
        free = s.free;
        p = node[bme + Field.Start];
        pStop = p < 0 ? p : p + node[bme + Field.Size];
        q = node[be + Field.Start];
        qStop = q < 0 ? q : q + node[be + Field.Size];
      }
      total += w;
      node[bi + Field.Weight] = -w;
      arena[free++] = i;
      if (i < s.firstHalo) bucketRemove(s, i); // halo variables are in no bucket
    }
    if (e !== me) {
      node[be + Field.Start] = -1;
      node[be + Field.Size] = 0;
      node[be + Field.Mark] = 0; // absorbed into me
    }
  }
  s.free = free;
  out.first = first;
  out.end = free;
  out.cliqueWeight = total;
}

function saveList(s: MdWorkspace, j: number, from: number, to: number): void {
  s.node[j * Field.Count + Field.Start] = to > from ? from : -1;
  s.node[j * Field.Count + Field.Size] = to > from ? to - from : 0;
}

/**
 * For each element e adjacent to a variable of Lme, set e's mark to mark0 + |Le \ Lme|
 * (weighted). Elements first met this round start from their clique weight.
 */
export function externalSizes(s: MdWorkspace, el: NewElement): void {
  const { arena, node } = s;
  const mark0 = s.mark0;
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const bi = arena[pm] * Field.Count;
    const wi = -node[bi + Field.Weight];
    const p0 = node[bi + Field.Start];
    const p1 = p0 + node[bi + Field.Elements];
    for (let p = p0; p < p1; p++) {
      const be = arena[p] * Field.Count;
      const m = node[be + Field.Mark];
      if (m >= mark0) node[be + Field.Mark] = m - wi;
      else if (m !== 0) node[be + Field.Mark] = node[be + Field.Degree] + mark0 - wi;
    }
  }
}
