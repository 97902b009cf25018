/**
 * Approximate minimum degree, part 2 (Amestoy, Davis & Duff 1996, SIAM J.
 * Matrix Anal. Appl. 17(4)): for every variable of the new clique Lme, prune
 * its lists, absorb elements whose clique lies inside Lme (aggressive
 * absorption), eliminate it together with the pivot when only the new element
 * remains (mass elimination), bound its external degree, merge
 * indistinguishable variables found by hashing, and put the survivors back
 * into the degree buckets. Halo variables (index ≥ firstHalo) have their
 * lists pruned like the others but are never mass eliminated, never merged
 * with a non-halo variable and never bucketed (their degree is not kept).
 */
import type { NewElement } from "./pivot-element.js";
import { bucketInsert, emitMembers, joinMembers, type MdWorkspace } from "./workspace.js";

/** Prune lists of Lme's variables and compute the degree part outside Lme. */
export function pruneAndBound(s: MdWorkspace, me: number, el: NewElement, aggressive: boolean): void {
  const { arena, start, size, elementCount, weight, mark, degree } = s;
  const { hashHead, bucketNext: hashNext, bucketPrev: hashKey } = s; // Lme's variables are out of their buckets
  const mark0 = s.mark0;
  const mask = hashMask(s, el.end - el.first);
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const i = arena[pm];
    const p1 = start[i];
    const p2 = p1 + elementCount[i];
    const pEnd = p1 + size[i];
    let pn = p1;
    let deg = 0;
    let hash = 0;
    for (let p = p1; p < p2; p++) {
      const e = arena[p];
      const m = mark[e];
      if (m === 0) continue;
      const outside = m - mark0;
      if (outside > 0 || !aggressive) {
        deg += outside;
        arena[pn++] = e;
        hash = (hash + e) | 0;
      } else {
        start[e] = -1; // Le inside Lme: absorb e into me
        size[e] = 0;
        mark[e] = 0;
      }
    }
    elementCount[i] = pn - p1 + 1;
    const p3 = pn;
    for (let p = p2; p < pEnd; p++) {
      const j = arena[p];
      const w = weight[j];
      if (w <= 0) continue; // in Lme (reached through me), merged, eliminated, or set aside
      deg += w;
      arena[pn++] = j;
      hash = (hash + j) | 0;
    }
    if (elementCount[i] === 1 && p3 === pn && i < s.firstHalo) {
      massEliminate(s, i, el);
      continue;
    }
    if (deg < degree[i]) degree[i] = deg;
    // me goes first: the first variable moves to the end, the first element to p3.
    arena[pn] = arena[p3];
    arena[p3] = arena[p1];
    arena[p1] = me;
    size[i] = pn - p1 + 1;
    const key = hash & mask;
    hashKey[i] = key;
    hashNext[i] = hashHead[key];
    hashHead[key] = i;
  }
}

/**
 * Buckets used for a clique of `count` variables, as a mask: the power of two
 * above 64·count (few collisions), capped by the table. Identical lists have
 * equal sums, so they meet in one bucket whatever the mask, and the merges do
 * not depend on it; a small part of the table stays in cache, unlike hash % n.
 */
function hashMask(s: MdWorkspace, count: number): number {
  const table = s.hashHead.length;
  return (count < table >> 6 ? 1 << (32 - Math.clz32(count << 6)) : table) - 1;
}

/** Variable i touches nothing but me: it is eliminated right after me. */
function massEliminate(s: MdWorkspace, i: number, el: NewElement): void {
  const wi = -s.weight[i];
  el.cliqueWeight -= wi;
  s.eliminated += wi;
  s.weight[i] = 0;
  s.start[i] = -1;
  s.size[i] = 0;
  emitMembers(s, i);
}

/** Merge variables of Lme that have identical lists (same hash bucket, then compared). */
export function mergeIndistinguishable(s: MdWorkspace, el: NewElement): void {
  const { arena, start, size, elementCount, weight, mark, hashHead, bucketNext: hashNext, bucketPrev: hashKey } = s;
  const halo = s.firstHalo;
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const i = arena[pm];
    if (weight[i] >= 0) continue;
    const key = hashKey[i];
    let a = hashHead[key];
    if (a === -1) continue;
    hashHead[key] = -1;
    for (; a !== -1 && hashNext[a] !== -1; a = hashNext[a]) {
      const len = size[a];
      const ec = elementCount[a];
      const pa = start[a];
      const mk = s.mark0;
      for (let p = pa + 1; p < pa + len; p++) mark[arena[p]] = mk;
      let prev = a;
      for (let b = hashNext[a]; b !== -1; b = hashNext[b]) {
        if (size[b] === len && elementCount[b] === ec && (a < halo) === (b < halo) && sameMarks(s, b, mk)) {
          weight[a] += weight[b];
          weight[b] = 0;
          start[b] = -1;
          size[b] = 0;
          joinMembers(s, a, b);
          hashNext[prev] = hashNext[b];
        } else prev = b;
      }
      s.mark0 = mk + 1;
    }
  }
}

function sameMarks(s: MdWorkspace, b: number, mk: number): boolean {
  const { arena, mark } = s;
  const pb = s.start[b];
  const stop = pb + s.size[b];
  for (let p = pb + 1; p < stop; p++) if (mark[arena[p]] !== mk) return false;
  return true;
}

/** Final degrees, buckets, and the clique of me compacted to its principal variables. */
export function finishElement(s: MdWorkspace, me: number, el: NewElement, builtAtEnd: boolean): void {
  const { arena, weight, degree } = s;
  const remaining = s.n - s.eliminated;
  const dme = el.cliqueWeight;
  let dst = el.first;
  for (let pm = el.first, pmEnd = el.end; pm < pmEnd; pm++) {
    const i = arena[pm];
    const w = weight[i];
    if (w >= 0) continue; // merged or mass eliminated (weight 0)
    const wi = -w;
    weight[i] = wi;
    const bound = remaining - wi;
    const d = degree[i] + dme - wi;
    if (i < s.firstHalo) bucketInsert(s, i, d < bound ? d : bound);
    arena[dst++] = i;
  }
  const len = dst - el.first;
  s.size[me] = len;
  s.degree[me] = dme;
  if (dme > s.maxElement) s.maxElement = dme;
  if (len === 0) {
    s.start[me] = -1;
    s.mark[me] = 0;
  }
  if (builtAtEnd) s.free = el.first + len;
}
