/**
 * Kernel selection: the numeric factorization asks for a DenseKernels set by
 * name. "auto" takes the WebAssembly SIMD set where the runtime's validator
 * accepts its binary (its fused multiply-add build where relaxed SIMD
 * validates too) and the plain-JS set otherwise; all satisfy the same
 * interface (src/kernels/types.ts).
 */
import { InputError } from "../errors.js";
import { jsKernels } from "./js/index.js";
import type { DenseKernels } from "./types.js";
import { type WasmVariant, wasmKernels, wasmKernelsAvailable } from "./wasm/index.js";

/** Options of {@link getKernels}. */
export interface KernelSelectOptions {
  /** Replaces `WebAssembly.validate` when deciding "auto" (for tests). */
  validate?: (bytes: Uint8Array) => boolean;
}

/**
 * What "auto" runs on a runtime whose validator is `validate` (default
 * `WebAssembly.validate`): the fused-multiply-add wasm build where relaxed
 * SIMD validates, the plain SIMD build where only SIMD does, else plain JS.
 */
export function autoChoice(validate?: (bytes: Uint8Array) => boolean): "js" | WasmVariant {
  if (!wasmKernelsAvailable(validate, "simd")) return "js";
  return wasmKernelsAvailable(validate, "fma") ? "fma" : "simd";
}

/**
 * A fresh dense kernel set with its own store. "wasm" throws when the runtime
 * lacks WebAssembly SIMD; "auto" falls back to "js" in that case.
 */
export function getKernels(name: "js" | "wasm" | "auto", options: KernelSelectOptions = {}): DenseKernels {
  switch (name) {
    case "js": return jsKernels();
    case "wasm": return wasmKernels();
    case "auto": {
      const choice = autoChoice(options.validate);
      return choice === "js" ? jsKernels() : wasmKernels({ variant: choice });
    }
    default: throw new InputError(`kernels must be "js", "wasm" or "auto", got ${JSON.stringify(name)}`);
  }
}
