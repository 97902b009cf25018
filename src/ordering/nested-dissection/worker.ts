/**
 * Entry of a nested-dissection helper thread (built as dist/dissection-worker.js;
 * see threads.ts and team.ts). It marks itself started, then for every job
 * dissects the pieces (or refines one cut's second start), posts the result
 * and flips the shared state, which wakes the thread that is waiting for it.
 * It stays for the next job.
 */
import { workerData, type MessagePort } from "node:worker_threads";
import { defaultLeafOrdering } from "./index.js";
import { dissectPieces, secondStart, type HelperInit, type HelperResult, type PieceMessage, type StartJob } from "./team.js";
import { signal, Slot } from "./threads.js";

const { control, port } = workerData as { control: Int32Array; port: MessagePort };
const orderLeaf = defaultLeafOrdering();
Atomics.store(control, Slot.Started, 1);
port.on("message", (job: { init: HelperInit; pieces: PieceMessage[] } | StartJob) => {
  let state = 1;
  try {
    if ("kind" in job) {
      const r = secondStart(job);
      port.postMessage(r, r.label === null ? [] : [r.label.buffer as ArrayBuffer]);
    } else {
      const r = dissectPieces(job.init, job.pieces, control, orderLeaf, (m) => port.postMessage(m));
      port.postMessage(r, [r.perm.buffer as ArrayBuffer]);
    }
  } catch (e) {
    const failed: Partial<HelperResult> = { error: e instanceof Error ? e.message : String(e) };
    port.postMessage(failed);
    state = 2;
  }
  Atomics.store(control, Slot.State, state);
  signal(control);
});
