// Types of scripts/wasm-source.mjs (imported by the tests).
export declare const TILE_MULADDS: number;
export declare function fusedText(text: string): string;
export declare function compileKernels(
  wabt: { parseWat(name: string, text: string, features: Record<string, boolean>): unknown },
  text: string,
): { simd: Uint8Array; fma: Uint8Array };
