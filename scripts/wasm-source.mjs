// Compiles the WebAssembly text of the dense kernels into its two binaries.
// Shared by scripts/build-wasm.mjs (which embeds them) and by
// test/kernels-wasm.test.ts (which checks the embedded bytes against them).
//
//  - "simd": kernels.wat as written (WebAssembly SIMD, f64x2 mul + add);
//  - "fma":  the same text with the micro-kernel's multiply-adds
//            `(f64x2.add (local.get $cXY) (f64x2.mul (local.get $aN) (local.get $bb)))`
//            rewritten to the relaxed-SIMD `f64x2.relaxed_madd`, which engines
//            with relaxed SIMD lower to a fused multiply-add. The loader uses
//            it only where the runtime's validator accepts it.

const MULADD = /\(f64x2\.add \(local\.get (\$c\d\d)\) \(f64x2\.mul \(local\.get (\$a\d)\) \(local\.get \$bb\)\)\)/g;
/** Multiply-adds in the 4×4 tile (8 accumulators). */
export const TILE_MULADDS = 8;

/** The relaxed-SIMD text derived from the plain SIMD text. */
export function fusedText(text) {
  let count = 0;
  const out = text.replace(MULADD, (_, c, a) => {
    count++;
    return `(f64x2.relaxed_madd (local.get ${a}) (local.get $bb) (local.get ${c}))`;
  });
  if (count !== TILE_MULADDS) throw new Error(`expected ${TILE_MULADDS} multiply-adds in the tile, found ${count}`);
  return out;
}

/** { simd, fma }: the two binaries (Uint8Array) of the kernel text, compiled with wabt. */
export function compileKernels(wabt, text) {
  const compile = (src, features) => {
    const mod = wabt.parseWat("kernels.wat", src, features);
    try {
      mod.validate();
      return mod.toBinary({}).buffer;
    } finally {
      mod.destroy();
    }
  };
  return {
    simd: compile(text, { simd: true }),
    fma: compile(fusedText(text), { simd: true, relaxed_simd: true }),
  };
}
