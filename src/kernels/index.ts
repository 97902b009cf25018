/**
 * Kernel selection: the numeric factorization asks for a DenseKernels set by
 * name. "auto" takes the WebAssembly SIMD set where the runtime's validator
 * accepts its binary and the plain-JS set otherwise; both satisfy the same
 * interface (src/kernels/types.ts).
 */
import { InputError } from "../errors.js";
import { jsKernels } from "./js/index.js";
import type { DenseKernels } from "./types.js";
import { wasmKernels, wasmKernelsAvailable } from "./wasm/index.js";

/** Options of {@link getKernels}. */
export interface KernelSelectOptions {
  /** Replaces `WebAssembly.validate` when deciding "auto" (for tests). */
  validate?: (bytes: Uint8Array) => boolean;
}

/**
 * A fresh dense kernel set with its own store. "wasm" throws when the runtime
 * lacks WebAssembly SIMD; "auto" falls back to "js" in that case.
 */
export function getKernels(name: "js" | "wasm" | "auto", options: KernelSelectOptions = {}): DenseKernels {
  switch (name) {
    case "js": return jsKernels();
    case "wasm": return wasmKernels();
    case "auto": return wasmKernelsAvailable(options.validate) ? wasmKernels() : jsKernels();
    default: throw new InputError(`kernels must be "js", "wasm" or "auto", got ${JSON.stringify(name)}`);
  }
}
