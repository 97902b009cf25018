/**
 * The WebAssembly SIMD dense kernel set: register-tiled GEMM/SYRK, blocked
 * POTRF, L·D·Lᵀ and TRSM (methods and papers named in kernels.wat) running on
 * one WebAssembly linear memory that IS the store, so the numeric code's
 * factor and frontal stack never get copied to call a kernel.
 *
 * Memory layout: bytes [0, 1638400) (25 pages) are the kernels' own scratch
 * (packed panels, edge tile, L·D·Lᵀ chunk; see kernels.wat); the store (the
 * Float64Array returned by `reserve`/`view`) starts at byte 1638400, and
 * store offset x is byte address 1638400 + 8x.
 *
 * Capacity: wasm32 memory has at most 65536 pages of 64 KiB (4 GiB), and
 * Node 20's V8 allows all of them (`new WebAssembly.Memory({ initial: 1,
 * maximum: 65536 })` is accepted, 65537 is a RangeError; tested), so a store of up to
 * (2^32 − 1638400) / 8 ≈ 536.7 million doubles fits. `reserve` computes the pages
 * a request needs before growing and throws CapacityError naming the bytes
 * requested and the page limit when it is beyond; a grow that the engine or
 * the OS refuses is reported the same way. A factor larger than one memory
 * would be chunked by the numeric phase, not here: since every kernel call
 * touches one front (its panel, its update block and the children's update
 * blocks being assembled), the factor can be kept in several stores (one
 * kernel set per chunk of the postordered supernodes, completed panels copied
 * out to plain Float64Arrays) with only the active fronts in wasm memory; the
 * kernels themselves never need more than one memory.
 */
import { CapacityError, InputError, SeptumError } from "../../errors.js";
import type { DenseKernels } from "../types.js";
import { KERNELS_WASM_BASE64, KERNELS_WASM_FMA_BASE64 } from "./binary.generated.js";

/** Bytes reserved for the kernels' scratch below the store (25 pages: see kernels.wat). */
export const STORE_BASE_BYTES = 1638400;
const BASE = STORE_BASE_BYTES;
const PAGE = 65536;
/** wasm32 limit: 65536 pages = 4 GiB. */
export const WASM32_MAX_PAGES = 65536;

/**
 * The two builds of the kernels: "simd" (f64x2 multiply then add; every
 * engine with WebAssembly SIMD) and "fma" (the 4×4 tile's multiply-adds as
 * relaxed-SIMD `f64x2.relaxed_madd`, a fused multiply-add where the engine
 * has relaxed SIMD: Node 20 only behind --experimental-wasm-relaxed-simd).
 */
export type WasmVariant = "simd" | "fma";

interface KernelExports {
  gemm(m: number, n: number, k: number, a: number, lda: number, b: number, ldb: number,
    c: number, ldc: number, lower: number): void;
  trsm(m: number, n: number, a: number, lda: number, b: number, ldb: number, unit: number): void;
  potrf(n: number, a: number, lda: number): number;
  ldlt(n: number, a: number, lda: number, tiny: number): number;
}

const bytesCache: Partial<Record<WasmVariant, Uint8Array<ArrayBuffer>>> = {};
const moduleCache: Partial<Record<WasmVariant, WebAssembly.Module>> = {};

function decodeBase64(text: string): Uint8Array<ArrayBuffer> {
  if (typeof atob === "function") {
    const s = atob(text);
    const out = new Uint8Array(s.length);
    for (let i = 0; i < s.length; i++) out[i] = s.charCodeAt(i);
    return out;
  }
  return new Uint8Array(Buffer.from(text, "base64"));
}

/** The embedded kernel binary of a variant (decoded once). */
export function wasmKernelBytes(variant: WasmVariant = "simd"): Uint8Array<ArrayBuffer> {
  return (bytesCache[variant] ??= decodeBase64(variant === "fma" ? KERNELS_WASM_FMA_BASE64 : KERNELS_WASM_BASE64));
}

/**
 * True when this runtime has WebAssembly and its validator accepts the
 * kernel binary of `variant` (default "simd"). `validate` replaces
 * `WebAssembly.validate` (tests use it to simulate other runtimes).
 */
export function wasmKernelsAvailable(
  validate?: (bytes: Uint8Array) => boolean, variant: WasmVariant = "simd",
): boolean {
  if (typeof WebAssembly !== "object" || WebAssembly === null) return false;
  try {
    return (validate ?? ((b: Uint8Array<ArrayBuffer>) => WebAssembly.validate(b)))(wasmKernelBytes(variant));
  } catch {
    return false;
  }
}

/** Options of {@link wasmKernels}. */
export interface WasmKernelOptions {
  /** Page limit of the memory, scratch included (default and upper bound: 65536 = 4 GiB; at least 26). */
  maxPages?: number;
  /** Which build: default "fma" where the runtime validates it, else "simd". */
  variant?: WasmVariant;
}

/** A WebAssembly kernel set, with the build that runs. */
export interface WasmKernels extends DenseKernels {
  readonly variant: WasmVariant;
}

/** Create a WebAssembly SIMD kernel set with its own linear memory as store. */
export function wasmKernels(options: WasmKernelOptions = {}): WasmKernels {
  const maxPages = options.maxPages ?? WASM32_MAX_PAGES;
  if (!Number.isInteger(maxPages) || maxPages <= BASE / PAGE || maxPages > WASM32_MAX_PAGES) {
    throw new InputError(`maxPages must be an integer in ${BASE / PAGE + 1}..${WASM32_MAX_PAGES}, got ${maxPages}`);
  }
  const variant = options.variant ?? (wasmKernelsAvailable(undefined, "fma") ? "fma" : "simd");
  if (!wasmKernelsAvailable(undefined, variant)) {
    throw new SeptumError(`this runtime's WebAssembly does not accept the ${variant} kernels; use the "js" kernels`);
  }
  const module = (moduleCache[variant] ??= new WebAssembly.Module(wasmKernelBytes(variant)));
  const memory = new WebAssembly.Memory({ initial: BASE / PAGE });
  const x = new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as KernelExports;
  let store = new Float64Array(0);
  const view = (): Float64Array => {
    if (store.buffer !== memory.buffer) {
      store = new Float64Array(memory.buffer, BASE, (memory.buffer.byteLength - BASE) / 8);
    }
    return store;
  };
  const reserve = (length: number): Float64Array => {
    if (!Number.isSafeInteger(length) || length < 0) {
      throw new InputError(`reserve: length must be a non-negative integer, got ${length}`);
    }
    const bytes = BASE + 8 * length;
    const pages = Math.ceil(bytes / PAGE);
    if (pages > maxPages) {
      throw new CapacityError(
        `a store of ${length} doubles needs ${bytes} bytes of WebAssembly memory (${pages} pages of 64 KiB); ` +
        `the limit is ${maxPages} pages = ${maxPages * PAGE} bytes`);
    }
    const have = memory.buffer.byteLength / PAGE;
    if (pages > have) {
      try {
        memory.grow(pages - have);
      } catch (e) {
        throw new CapacityError(
          `the runtime refused to grow WebAssembly memory to ${pages * PAGE} bytes ` +
          `(store of ${length} doubles; limit ${maxPages} pages): ${String(e)}`);
      }
    }
    return view();
  };
  const addr = (off: number): number => BASE + 8 * off;
  return {
    name: "wasm",
    variant,
    reserve,
    view,
    potrf: (n, a, lda) => x.potrf(n, addr(a), lda),
    ldlt: (n, a, lda, tiny) => x.ldlt(n, addr(a), lda, tiny),
    trsm: (m, n, a, lda, b, ldb, unit) => x.trsm(m, n, addr(a), lda, addr(b), ldb, unit ? 1 : 0),
    gemm: (m, n, k, a, lda, b, ldb, c, ldc, lower) =>
      x.gemm(m, n, k, addr(a), lda, addr(b), ldb, addr(c), ldc, lower ? 1 : 0),
  };
}
