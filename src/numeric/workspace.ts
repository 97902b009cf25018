/**
 * Memory of the multifrontal factorization, predicted before anything is
 * allocated. The store holds the factor (fixed), then a stack of contribution
 * blocks, then a scratch block for L·D·Lᵀ. The stack is simulated over the
 * supernodal tree; the children of every node are visited in the order that
 * minimises the peak (Liu 1986, "On the storage requirement in the
 * out-of-core multifrontal method for sparse factorization", ACM TOMS 12(3):
 * decreasing peak(c) − cb(c)).
 */
import { childLists } from "../symbolic/etree.js";
import type { SupernodalStructure } from "../symbolic/types.js";
import { panelBlockSize } from "./contribution.js";
import type { FactorMethod } from "./types.js";

/** Predicted store size, in doubles, and bytes. */
export interface WorkspacePrediction {
  /** Doubles of the factor (the panels of all supernodes). */
  readonly factorDoubles: number;
  /** Peak doubles of the contribution-block stack. */
  readonly stackDoubles: number;
  /** Doubles of scratch (W = L21·D of the largest panel for L·D·Lᵀ, 0 for Cholesky). */
  readonly scratchDoubles: number;
  /** 8 × (factor + stack + scratch). */
  readonly peakBytes: number;
}

/** Processing order of the supernodes (a postorder) and the resulting stack peak. */
export interface StackSchedule {
  readonly order: Int32Array;
  readonly peak: number;
  /** Children of s, in processing order: children[childPtr[s] .. childPtr[s+1]). */
  readonly childPtr: Int32Array;
  readonly children: Int32Array;
}

/** Doubles of the contribution block of supernode s (order b = m − c, panel storage of contribution.ts). */
export function contributionSize(st: SupernodalStructure, s: number): number {
  return panelBlockSize(st.rowPtr[s + 1] - st.rowPtr[s] - (st.superStart[s + 1] - st.superStart[s]));
}

/** Liu's child ordering and the postorder it induces; peak of the stack over that order. */
export function stackSchedule(st: SupernodalStructure): StackSchedule {
  const ns = st.supernodeCount, parent = st.superParent;
  const peak = new Float64Array(ns), cb = new Float64Array(ns);
  const { childPtr, children } = childLists(parent);
  for (let s = 0; s < ns; s++) {
    // Children precede parents (postorder), so their peaks are known.
    cb[s] = contributionSize(st, s);
    const kids = children.subarray(childPtr[s], childPtr[s + 1]);
    kids.sort((a, b) => (peak[b] - cb[b]) - (peak[a] - cb[a]));
    let below = 0, p = 0;
    for (let t = 0; t < kids.length; t++) {
      p = Math.max(p, below + peak[kids[t]]);
      below += cb[kids[t]];
    }
    peak[s] = Math.max(p, below + cb[s]);
  }
  const order = new Int32Array(ns);
  const stack = new Int32Array(ns), cursor = new Int32Array(ns);
  let k = 0, top = 0, overall = 0, pending = 0;
  for (let r = 0; r < ns; r++) {
    if (parent[r] >= 0) continue;
    overall = Math.max(overall, pending + peak[r]);
    pending += cb[r];
    stack[top++] = r;
    cursor[r] = childPtr[r];
    while (top > 0) {
      const s = stack[top - 1];
      if (cursor[s] < childPtr[s + 1]) {
        const c = children[cursor[s]++];
        cursor[c] = childPtr[c];
        stack[top++] = c;
      } else {
        order[k++] = s;
        top--;
      }
    }
  }
  return { order, peak: overall, childPtr, children };
}

/** Predict the store the factorization will reserve, before allocating it. */
export function predictWorkspace(structure: SupernodalStructure, method: FactorMethod = "cholesky"): WorkspacePrediction {
  return workspaceOf(structure, method, stackSchedule(structure));
}

/** The store for a schedule already computed (the factorization keeps its own). */
export function workspaceOf(structure: SupernodalStructure, method: FactorMethod, schedule: StackSchedule): WorkspacePrediction {
  const ns = structure.supernodeCount;
  const factorDoubles = structure.factorPtr[ns];
  const stackDoubles = schedule.peak;
  let scratchDoubles = 0;
  if (method === "ldlt") {
    for (let s = 0; s < ns; s++) {
      const c = structure.superStart[s + 1] - structure.superStart[s];
      const m = structure.rowPtr[s + 1] - structure.rowPtr[s];
      scratchDoubles = Math.max(scratchDoubles, (m - c) * c);
    }
  }
  return { factorDoubles, stackDoubles, scratchDoubles, peakBytes: 8 * (factorDoubles + stackDoubles + scratchDoubles) };
}
