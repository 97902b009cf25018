/**
 * Helper threads for nested dissection. Once the top separators are found,
 * the pieces below them are independent subproblems (George 1973; the
 * subtree-to-thread mapping of Pothen & Sun 1993, "A mapping algorithm for
 * parallel sparse Cholesky factorization", SIAM J. Sci. Comput. 14(5)): the
 * calling thread hands some of them to helper threads and cuts the rest
 * itself. Node's worker_threads only (reached through
 * process.getBuiltinModule, so bundles for other runtimes carry no import);
 * anywhere else, or when the helper script is missing, everything runs on the
 * calling thread. The call stays synchronous: the caller blocks on a shared
 * Int32Array (Atomics.wait) and takes the result with receiveMessageOnPort.
 */
import type * as WorkerThreads from "node:worker_threads";
import { quotaCores } from "./cores.js";

type Threads = typeof WorkerThreads;

/**
 * Slots of the control array shared with a helper. State: 0 while it works,
 * 1 once its result is posted, 2 when it failed. Abort: set to 1 by the
 * caller to stop it between pieces. Placed: vertices it has placed (progress).
 * Started: set as soon as its script runs. Beat: bumped after every piece (a
 * sign of life). Want: set to 1 by an idle caller asking for a piece; Given:
 * the helper's answer, 1 when it posted a piece, 2 when it has none to give.
 * Event: bumped (and waited on) whenever State or Given changes.
 */
export const Slot = { State: 0, Abort: 1, Placed: 2, Started: 3, Beat: 4, Want: 5, Given: 6, Event: 7 } as const;
const SLOTS = 8;

/** Bumps the event counter and wakes the waiting caller (helper side). */
export function signal(control: Int32Array): void {
  Atomics.add(control, Slot.Event, 1);
  Atomics.notify(control, Slot.Event);
}

/** A Node built-in module, or null outside Node (or on a Node without getBuiltinModule). */
function builtin<T>(id: string): T | null {
  const proc = (globalThis as { process?: { getBuiltinModule?: (id: string) => unknown } }).process;
  if (typeof proc?.getBuiltinModule !== "function") return null;
  try {
    return (proc.getBuiltinModule(id) as T) ?? null;
  } catch {
    return null;
  }
}

/**
 * Cores the process may use (1 where that cannot be told): Node's count,
 * capped by a Linux cgroup CPU quota (read once per process).
 */
export function availableCores(): number {
  const os = builtin<typeof import("node:os")>("node:os");
  if (os === null) return 1;
  const count = typeof os.availableParallelism === "function" ? os.availableParallelism() : os.cpus().length;
  quota ??= { cores: quotaCores(readText) };
  return quota.cores === null ? count : Math.min(count, quota.cores);
}

let quota: { cores: number | null } | undefined;

/** A small text file's contents, or null. */
function readText(path: string): string | null {
  const fs = builtin<typeof import("node:fs")>("node:fs");
  try {
    return fs === null ? null : fs.readFileSync(path, "utf8");
  } catch {
    return null;
  }
}

/** The helper script built beside this bundle (dist/dissection-worker.js), or null when it is not there. */
export function defaultHelperScript(): URL | null {
  const fs = builtin<typeof import("node:fs")>("node:fs");
  if (fs === null) return null;
  try {
    const url = new URL("./dissection-worker.js", import.meta.url);
    return url.protocol === "file:" && fs.existsSync(url) ? url : null;
  } catch {
    return null;
  }
}

/** One helper thread: its worker, the caller's end of its port and the shared control array. */
export interface Helper {
  readonly threads: Threads;
  readonly worker: WorkerThreads.Worker;
  readonly port: WorkerThreads.MessagePort;
  readonly control: Int32Array;
  readonly script: string;
  /** Taken by a dissection (from {@link takeHelper} until its result is in, or it is released). */
  taken: boolean;
}

/**
 * Helpers kept between dissections: a new thread compiles the dissection code
 * afresh (on the 1000² grid, with a new helper for every call, 3.44 s wall
 * against 2.86 s with the pool; bench medians of 5). Unreferenced, they never
 * keep the process alive.
 */
const pool: Helper[] = [];

/**
 * A helper running `script`: an idle one from the pool, or a new one; null
 * when threads are not available here. The helper waits for a job ({@link sendJob}).
 */
export function takeHelper(script: URL): Helper | null {
  const idle = pool.find((h) => !h.taken && h.script === script.href);
  if (idle !== undefined) { idle.taken = true; return idle; }
  if (neverStarted.has(script.href)) return null;
  const threads = builtin<Threads>("node:worker_threads");
  if (threads === null || !canBlock()) return null;
  try {
    const control = new Int32Array(new SharedArrayBuffer(4 * SLOTS));
    const { port1, port2 } = new threads.MessageChannel();
    // no inherited flags: `node -e` / `--input-type` (and others meant for the main script) stop a worker from starting
    const worker = new threads.Worker(script, { workerData: { control, port: port2 }, transferList: [port2], execArgv: [] });
    worker.unref();
    port1.unref();
    const h: Helper = { threads, worker, port: port1, control, script: script.href, taken: true };
    worker.on("error", () => dropHelper(h)); // a helper that dies between jobs leaves the pool
    pool.push(h);
    return h;
  } catch {
    return null;
  }
}

let blocking: boolean | undefined;

/** Whether this thread may block in Atomics.wait (some runtimes forbid it on their main thread); found once. */
function canBlock(): boolean {
  if (blocking === undefined) {
    try {
      blocking = Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 1, 0) === "not-equal";
    } catch {
      blocking = false;
    }
  }
  return blocking;
}

/**
 * Hands the helper a job (copied; the caller keeps its own data, to redo the
 * work should the helper fail).
 */
export function sendJob(h: Helper, message: object): void {
  for (const slot of [Slot.State, Slot.Abort, Slot.Placed, Slot.Beat, Slot.Want, Slot.Given]) Atomics.store(h.control, slot, 0);
  h.port.postMessage(message);
}

/** Vertices placed by the helper in its current job. */
export function helperPlaced(h: Helper): number {
  return Atomics.load(h.control, Slot.Placed);
}

/** Asks the working helper for one of its pieces (answered through {@link awaitEvent}). */
export function askForPiece(h: Helper): void {
  Atomics.store(h.control, Slot.Given, 0);
  Atomics.store(h.control, Slot.Want, 1);
}

/**
 * A helper that has not started within this time is given up (its work is
 * redone by the caller), and its script is not tried again in this process:
 * a script that cannot start would otherwise cost this wait on every call.
 */
const START_MS = 5_000;
const neverStarted = new Set<string>();
/** A helper that shows no sign of life for this long is given up. */
const SILENT_MS = 120_000;
/** The caller wakes this often while it waits, to report progress. */
const TICK_MS = 50;

/** What the helper did: posted a piece, has none to give, posted its result, or failed (or fell silent). */
export type HelperEvent = "piece" | "none" | "done" | "failed";

/**
 * Blocks until the helper answers a request for a piece or ends its job.
 * `tick` runs between waits (progress, abort checks; it may throw, and the
 * caller then releases the helper as working). On "piece" and "done" the
 * message is waiting: take it with {@link takeMessage}.
 */
export function awaitEvent(h: Helper, tick: () => void): HelperEvent {
  const c = h.control;
  let last = -1;
  let since = performance.now();
  const t0 = since;
  for (;;) {
    const event = Atomics.load(c, Slot.Event);
    const given = Atomics.load(c, Slot.Given);
    if (given !== 0) { Atomics.store(c, Slot.Given, 0); Atomics.store(c, Slot.Want, 0); return given === 1 ? "piece" : "none"; }
    const state = Atomics.load(c, Slot.State);
    if (state !== 0) return state === 1 ? "done" : "failed";
    Atomics.wait(c, Slot.Event, event, TICK_MS);
    tick();
    const beat = Atomics.load(c, Slot.Beat);
    const now = performance.now();
    if (beat !== last) { last = beat; since = now; }
    const started = Atomics.load(c, Slot.Started) === 1;
    if (!started && now - t0 > START_MS) { neverStarted.add(h.script); return "failed"; }
    if (started && now - since > SILENT_MS) return "failed";
  }
}

/** The next message from the helper: it may reach the port just after the control array changed, so look a few times. */
export function takeMessage<T>(h: Helper): T | null {
  for (let i = 0; i < 200; i++) {
    const m = h.threads.receiveMessageOnPort(h.port);
    if (m !== undefined) return m.message as T;
    Atomics.wait(h.control, Slot.Abort, 0, 5);
  }
  return null;
}

/** Gives a taken helper back: to the pool when it has no job, else (its job abandoned) it is stopped. */
export function releaseHelper(h: Helper, working: boolean): void {
  if (working) dropHelper(h);
  else h.taken = false;
}

/** Stops the helper and removes it from the pool. */
function dropHelper(h: Helper): void {
  const i = pool.indexOf(h);
  if (i >= 0) pool.splice(i, 1);
  Atomics.store(h.control, Slot.Abort, 1);
  h.port.close();
  void h.worker.terminate();
}
