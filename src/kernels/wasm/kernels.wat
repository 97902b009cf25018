;; Dense kernels of the supernodal factorization in WebAssembly SIMD (f64x2).
;;
;; Methods: register-tiled C −= A·Bᵀ with cache blocking over k and m (Goto &
;; van de Geijn 2008, "Anatomy of high-performance matrix multiplication",
;; ACM TOMS 34(3)); blocked right-looking Cholesky and L·D·Lᵀ built on it and on
;; a left-looking blocked triangular solve (Golub & Van Loan, "Matrix
;; Computations", 4th ed., sections 3.1 and 4.2; from memory).
;;
;; Why WebAssembly text and not a higher-level language: the whole speed of the
;; kernel is the 4×4 register tile (eight f64x2 accumulators, two vector loads
;; of A and four load-and-splat of B per step of k). Written in text form each
;; accumulator is a local that the engine keeps in an xmm register, the loads
;; are exactly `v128.load` / `v128.load64_splat`, and nothing sits between the
;; source and the instructions (AssemblyScript would put a compiler's choices
;; there, and a second toolchain into the build). The text compiles with the
;; `wabt` dev dependency (scripts/build-wasm.mjs) into a binary embedded as
;; base64; a second build rewrites the tile's eight multiply-adds into the
;; relaxed-SIMD fused `f64x2.relaxed_madd` (scripts/wasm-source.mjs), used
;; where the runtime validates relaxed SIMD.
;;
;; Tile shape, measured on this project's machine (packed slivers, k = 256,
;; CPU time, shared machine, medians of 9): 4×4 8.0, 4×6 7.5, 6×4 8.1,
;; 8×4 7.1, 8×2 8.9, 4×8 6.3 GF/s; with fused multiply-add 4×4 14.0, 6×4 10.1,
;; 8×4 9.8 GF/s. Without FMA the tile is bound by the separate f64x2 multiply
;; and add (16 vector ops per step of k for 32 flops) whatever its shape, and
;; the shapes with 12+ accumulators spill on x64's 16 xmm registers; 4×4
;; is the simplest shape at the top of both lists.
;;
;; Calling convention (all exported functions):
;;   - operands are BYTE addresses into linear memory (the JS loader adds the
;;     store's base to 8 × the store offset); addresses are used unsigned, so
;;     a store may reach 4 GiB;
;;   - leading dimensions are in ELEMENTS (converted to bytes here);
;;   - blocks are column-major doubles.
;; Memory below the store is this module's scratch (the JS loader places the
;; store at byte 1638400 = 25 pages):
;;   [0, 262144)        L·D·Lᵀ row chunk (128 rows × up to 256 columns)
;;   [262144, 262272)   one 4×4 tile for edge updates
;;   [327680, 589824)   packed slab of A (128 rows × 256 deep)
;;   [589824, 1638400)  packed panel of B (512 rows × 256 deep)
(module
  (import "env" "memory" (memory 1))

  ;; Cache blocking (packed path): B is cut into panels of NC = 512 rows ×
  ;; KC = 256 deep and A into slabs of MC = 128 rows × KC, each copied into
  ;; 4-row slivers (contiguous 32-byte steps of k, zero-padded at the edge), so
  ;; the A slab (256 KiB) stays in L2, one B sliver (8 KiB) in L1, and the
  ;; micro-kernel's loads never cross a page per step whatever the leading
  ;; dimension (measured: 9.0 vs 4.6 GF/s for ld = 16 vs 512 unpacked).

  ;; ---------------------------------------------------------------------
  ;; 4×4 micro-kernel: C[0:4,0:4] −= A[0:4,0:k]·B[0:4,0:k]ᵀ. Strides in bytes.
  ;; $diag = 1: only entries i ≥ j are written (tile on the diagonal);
  ;; $diag = 2: the product A·Bᵀ itself goes to the edge tile at 262144 (C unused).
  (func $tile44 (param $k i32) (param $a i32) (param $lda i32) (param $b i32) (param $ldb i32)
                (param $c i32) (param $ldc i32) (param $diag i32)
    (local $c00 v128) (local $c01 v128) (local $c10 v128) (local $c11 v128)
    (local $c20 v128) (local $c21 v128) (local $c30 v128) (local $c31 v128)
    (local $a0 v128) (local $a1 v128) (local $bb v128) (local $p i32)
    (loop $L
      (local.set $a0 (v128.load (local.get $a)))
      (local.set $a1 (v128.load offset=16 (local.get $a)))
      (local.set $bb (v128.load64_splat (local.get $b)))
      (local.set $c00 (f64x2.add (local.get $c00) (f64x2.mul (local.get $a0) (local.get $bb))))
      (local.set $c01 (f64x2.add (local.get $c01) (f64x2.mul (local.get $a1) (local.get $bb))))
      (local.set $bb (v128.load64_splat offset=8 (local.get $b)))
      (local.set $c10 (f64x2.add (local.get $c10) (f64x2.mul (local.get $a0) (local.get $bb))))
      (local.set $c11 (f64x2.add (local.get $c11) (f64x2.mul (local.get $a1) (local.get $bb))))
      (local.set $bb (v128.load64_splat offset=16 (local.get $b)))
      (local.set $c20 (f64x2.add (local.get $c20) (f64x2.mul (local.get $a0) (local.get $bb))))
      (local.set $c21 (f64x2.add (local.get $c21) (f64x2.mul (local.get $a1) (local.get $bb))))
      (local.set $bb (v128.load64_splat offset=24 (local.get $b)))
      (local.set $c30 (f64x2.add (local.get $c30) (f64x2.mul (local.get $a0) (local.get $bb))))
      (local.set $c31 (f64x2.add (local.get $c31) (f64x2.mul (local.get $a1) (local.get $bb))))
      (local.set $a (i32.add (local.get $a) (local.get $lda)))
      (local.set $b (i32.add (local.get $b) (local.get $ldb)))
      (br_if $L (i32.ne (local.tee $p (i32.add (local.get $p) (i32.const 1))) (local.get $k))))
    (if (i32.eq (local.get $diag) (i32.const 2))
      (then
        (v128.store offset=262144 (i32.const 0) (local.get $c00))
        (v128.store offset=262160 (i32.const 0) (local.get $c01))
        (v128.store offset=262176 (i32.const 0) (local.get $c10))
        (v128.store offset=262192 (i32.const 0) (local.get $c11))
        (v128.store offset=262208 (i32.const 0) (local.get $c20))
        (v128.store offset=262224 (i32.const 0) (local.get $c21))
        (v128.store offset=262240 (i32.const 0) (local.get $c30))
        (v128.store offset=262256 (i32.const 0) (local.get $c31))
        (return)))
    ;; column 0: rows 0..3 (all on or below the diagonal)
    (v128.store (local.get $c) (f64x2.sub (v128.load (local.get $c)) (local.get $c00)))
    (v128.store offset=16 (local.get $c) (f64x2.sub (v128.load offset=16 (local.get $c)) (local.get $c01)))
    (local.set $c (i32.add (local.get $c) (local.get $ldc)))
    (if (local.get $diag)
      (then
        ;; column 1: row 1 alone, rows 2..3; column 2: rows 2..3; column 3: row 3
        (f64.store offset=8 (local.get $c)
          (f64.sub (f64.load offset=8 (local.get $c)) (f64x2.extract_lane 1 (local.get $c10))))
        (v128.store offset=16 (local.get $c) (f64x2.sub (v128.load offset=16 (local.get $c)) (local.get $c11)))
        (local.set $c (i32.add (local.get $c) (local.get $ldc)))
        (v128.store offset=16 (local.get $c) (f64x2.sub (v128.load offset=16 (local.get $c)) (local.get $c21)))
        (local.set $c (i32.add (local.get $c) (local.get $ldc)))
        (f64.store offset=24 (local.get $c)
          (f64.sub (f64.load offset=24 (local.get $c)) (f64x2.extract_lane 1 (local.get $c31)))))
      (else
        (v128.store (local.get $c) (f64x2.sub (v128.load (local.get $c)) (local.get $c10)))
        (v128.store offset=16 (local.get $c) (f64x2.sub (v128.load offset=16 (local.get $c)) (local.get $c11)))
        (local.set $c (i32.add (local.get $c) (local.get $ldc)))
        (v128.store (local.get $c) (f64x2.sub (v128.load (local.get $c)) (local.get $c20)))
        (v128.store offset=16 (local.get $c) (f64x2.sub (v128.load offset=16 (local.get $c)) (local.get $c21)))
        (local.set $c (i32.add (local.get $c) (local.get $ldc)))
        (v128.store (local.get $c) (f64x2.sub (v128.load (local.get $c)) (local.get $c30)))
        (v128.store offset=16 (local.get $c) (f64x2.sub (v128.load offset=16 (local.get $c)) (local.get $c31))))))

  ;; ---------------------------------------------------------------------
  ;; Edge tile (mr < 4 or nr < 4), scalar: C[i,j] −= Σ_p A[i,p]·B[j,p] for
  ;; i < mr, j < nr, restricted to off + i ≥ j (off = i0 − j0 in the lower
  ;; variant, a large number otherwise). Strides in bytes.
  (func $edge (param $mr i32) (param $nr i32) (param $k i32) (param $a i32) (param $lda i32)
              (param $b i32) (param $ldb i32) (param $c i32) (param $ldc i32) (param $off i32)
    (local $i i32) (local $j i32) (local $p i32) (local $pa i32) (local $pb i32) (local $s f64)
    (local $cj i32)
    (block $JD (loop $J
      (br_if $JD (i32.ge_s (local.get $j) (local.get $nr)))
      (local.set $cj (i32.add (local.get $c) (i32.mul (local.get $j) (local.get $ldc))))
      (local.set $i (i32.const 0))
      (block $ID (loop $I
        (br_if $ID (i32.ge_s (local.get $i) (local.get $mr)))
        (if (i32.ge_s (i32.add (local.get $off) (local.get $i)) (local.get $j))
          (then
            (local.set $s (f64.const 0))
            (local.set $pa (i32.add (local.get $a) (i32.shl (local.get $i) (i32.const 3))))
            (local.set $pb (i32.add (local.get $b) (i32.shl (local.get $j) (i32.const 3))))
            (local.set $p (i32.const 0))
            (loop $P
              (local.set $s (f64.add (local.get $s) (f64.mul (f64.load (local.get $pa)) (f64.load (local.get $pb)))))
              (local.set $pa (i32.add (local.get $pa) (local.get $lda)))
              (local.set $pb (i32.add (local.get $pb) (local.get $ldb)))
              (br_if $P (i32.lt_s (local.tee $p (i32.add (local.get $p) (i32.const 1))) (local.get $k))))
            (f64.store (i32.add (local.get $cj) (i32.shl (local.get $i) (i32.const 3)))
              (f64.sub (f64.load (i32.add (local.get $cj) (i32.shl (local.get $i) (i32.const 3)))) (local.get $s)))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $I)))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $J))))

  ;; ---------------------------------------------------------------------
  ;; Rows [i0, i1) of one KC slice: the 4-wide column tiles j (j < n), and
  ;; for the lower variant only tiles with i ≥ j. Strides in bytes.
  (func $slab (param $i0 i32) (param $i1 i32) (param $n i32) (param $k i32)
              (param $a i32) (param $lda i32) (param $b i32) (param $ldb i32)
              (param $c i32) (param $ldc i32) (param $lower i32)
    (local $i i32) (local $j i32) (local $mr i32) (local $nr i32)
    (local $pa i32) (local $pb i32) (local $pc i32)
    (block $JD (loop $J
      (br_if $JD (i32.ge_s (local.get $j) (local.get $n)))
      (br_if $JD (i32.and (local.get $lower) (i32.ge_s (local.get $j) (local.get $i1))))
      (local.set $nr (select (i32.const 4) (i32.sub (local.get $n) (local.get $j))
                             (i32.ge_s (i32.sub (local.get $n) (local.get $j)) (i32.const 4))))
      (local.set $i (local.get $i0))
      (if (i32.and (local.get $lower) (i32.gt_s (local.get $j) (local.get $i0)))
        (then (local.set $i (local.get $j))))
      (local.set $pb (i32.add (local.get $b) (i32.shl (local.get $j) (i32.const 3))))
      (block $ID (loop $I
        (br_if $ID (i32.ge_s (local.get $i) (local.get $i1)))
        (local.set $mr (select (i32.const 4) (i32.sub (local.get $i1) (local.get $i))
                               (i32.ge_s (i32.sub (local.get $i1) (local.get $i)) (i32.const 4))))
        (local.set $pa (i32.add (local.get $a) (i32.shl (local.get $i) (i32.const 3))))
        (local.set $pc (i32.add (i32.add (local.get $c) (i32.shl (local.get $i) (i32.const 3)))
                                (i32.mul (local.get $j) (local.get $ldc))))
        (if (i32.and (i32.eq (local.get $mr) (i32.const 4)) (i32.eq (local.get $nr) (i32.const 4)))
          (then
            (call $tile44 (local.get $k) (local.get $pa) (local.get $lda) (local.get $pb) (local.get $ldb)
              (local.get $pc) (local.get $ldc)
              (i32.and (local.get $lower) (i32.eq (local.get $i) (local.get $j)))))
          (else
            (call $edge (local.get $mr) (local.get $nr) (local.get $k) (local.get $pa) (local.get $lda)
              (local.get $pb) (local.get $ldb) (local.get $pc) (local.get $ldc)
              (select (i32.sub (local.get $i) (local.get $j)) (i32.const 0x40000000) (local.get $lower)))))
        (local.set $i (i32.add (local.get $i) (i32.const 4)))
        (br $I)))
      (local.set $j (i32.add (local.get $j) (i32.const 4)))
      (br $J))))

  ;; ---------------------------------------------------------------------
  ;; C −= A·Bᵀ without packing, for small operands. Strides in bytes.
  ;; Loops: slices of 256 of k, slabs of 128 rows, then tiles.
  (func $gemm_direct (param $m i32) (param $n i32) (param $k i32) (param $a i32) (param $lda i32)
                (param $b i32) (param $ldb i32) (param $c i32) (param $ldc i32) (param $lower i32)
    (local $p0 i32) (local $kc i32) (local $i0 i32) (local $i1 i32)
    (if (i32.or (i32.or (i32.le_s (local.get $m) (i32.const 0)) (i32.le_s (local.get $n) (i32.const 0)))
                (i32.le_s (local.get $k) (i32.const 0)))
      (then (return)))
    (block $PD (loop $P
      (br_if $PD (i32.ge_s (local.get $p0) (local.get $k)))
      (local.set $kc (select (i32.const 256) (i32.sub (local.get $k) (local.get $p0))
                             (i32.ge_s (i32.sub (local.get $k) (local.get $p0)) (i32.const 256))))
      (local.set $i0 (i32.const 0))
      (block $ID (loop $I
        (br_if $ID (i32.ge_s (local.get $i0) (local.get $m)))
        (local.set $i1 (select (i32.add (local.get $i0) (i32.const 128)) (local.get $m)
                               (i32.lt_s (i32.add (local.get $i0) (i32.const 128)) (local.get $m))))
        (call $slab (local.get $i0) (local.get $i1) (local.get $n) (local.get $kc)
          (local.get $a) (local.get $lda) (local.get $b) (local.get $ldb)
          (local.get $c) (local.get $ldc) (local.get $lower))
        (local.set $i0 (local.get $i1))
        (br $I)))
      (local.set $a (i32.add (local.get $a) (i32.mul (local.get $kc) (local.get $lda))))
      (local.set $b (i32.add (local.get $b) (i32.mul (local.get $kc) (local.get $ldb))))
      (local.set $p0 (i32.add (local.get $p0) (local.get $kc)))
      (br $P))))

  ;; ---------------------------------------------------------------------
  ;; Pack rows [0, r) × steps [0, kc) of a block at src (ld in bytes) into
  ;; 4-row slivers at dst: (i, p) → dst + 32·kc·(i/4) + 32·p + 8·(i mod 4);
  ;; the rows from r up to the next multiple of 4 are zero.
  (func $pack (param $r i32) (param $kc i32) (param $src i32) (param $ld i32) (param $dst i32)
    (local $p i32) (local $i i32) (local $col i32) (local $d i32) (local $stride i32) (local $full i32)
    (local $t i32)
    (local.set $stride (i32.shl (local.get $kc) (i32.const 5)))
    (local.set $full (i32.and (local.get $r) (i32.const -4)))
    (block $PD (loop $P
      (br_if $PD (i32.ge_s (local.get $p) (local.get $kc)))
      (local.set $col (i32.add (local.get $src) (i32.mul (local.get $p) (local.get $ld))))
      (local.set $d (i32.add (local.get $dst) (i32.shl (local.get $p) (i32.const 5))))
      (local.set $i (i32.const 0))
      (block $ID (loop $I
        (br_if $ID (i32.ge_s (local.get $i) (local.get $full)))
        (v128.store (local.get $d) (v128.load (local.get $col)))
        (v128.store offset=16 (local.get $d) (v128.load offset=16 (local.get $col)))
        (local.set $col (i32.add (local.get $col) (i32.const 32)))
        (local.set $d (i32.add (local.get $d) (local.get $stride)))
        (local.set $i (i32.add (local.get $i) (i32.const 4)))
        (br $I)))
      (if (i32.lt_s (local.get $i) (local.get $r))
        (then
          (local.set $t (i32.const 0))
          (loop $T
            (if (i32.lt_s (i32.add (local.get $i) (local.get $t)) (local.get $r))
              (then (f64.store (local.get $d) (f64.load (local.get $col))))
              (else (f64.store (local.get $d) (f64.const 0))))
            (local.set $col (i32.add (local.get $col) (i32.const 8)))
            (local.set $d (i32.add (local.get $d) (i32.const 8)))
            (br_if $T (i32.lt_s (local.tee $t (i32.add (local.get $t) (i32.const 1))) (i32.const 4))))))
      (local.set $p (i32.add (local.get $p) (i32.const 1)))
      (br $P))))

  ;; C[0:mr, 0:nr] −= edge tile (at 262144, 4×4), restricted to off + i ≥ j.
  (func $flush (param $mr i32) (param $nr i32) (param $c i32) (param $ldc i32) (param $off i32)
    (local $i i32) (local $j i32) (local $cj i32)
    (block $JD (loop $J
      (br_if $JD (i32.ge_s (local.get $j) (local.get $nr)))
      (local.set $cj (i32.add (local.get $c) (i32.mul (local.get $j) (local.get $ldc))))
      (local.set $i (i32.const 0))
      (block $ID (loop $I
        (br_if $ID (i32.ge_s (local.get $i) (local.get $mr)))
        (if (i32.ge_s (i32.add (local.get $off) (local.get $i)) (local.get $j))
          (then
            (f64.store (i32.add (local.get $cj) (i32.shl (local.get $i) (i32.const 3)))
              (f64.sub (f64.load (i32.add (local.get $cj) (i32.shl (local.get $i) (i32.const 3))))
                       (f64.load offset=262144
                         (i32.shl (i32.add (local.get $i) (i32.shl (local.get $j) (i32.const 2))) (i32.const 3)))))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $I)))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $J))))

  ;; One packed A slab (rows ic.., mc of them, at 327680) against one packed B
  ;; panel (rows jc.., nc of them, at 589824), kc deep: all 4×4 tiles of C.
  (func $macro (param $ic i32) (param $mc i32) (param $jc i32) (param $nc i32) (param $kc i32)
               (param $c i32) (param $ldc i32) (param $lower i32)
    (local $jr i32) (local $ir i32) (local $i i32) (local $j i32) (local $mr i32) (local $nr i32)
    (local $pb i32) (local $pc i32) (local $sl i32)
    (local.set $sl (i32.shl (local.get $kc) (i32.const 5)))
    (block $JD (loop $J
      (br_if $JD (i32.ge_s (local.get $jr) (local.get $nc)))
      (local.set $j (i32.add (local.get $jc) (local.get $jr)))
      (br_if $JD (i32.and (local.get $lower)
                          (i32.ge_s (local.get $j) (i32.add (local.get $ic) (local.get $mc)))))
      (local.set $nr (select (i32.const 4) (i32.sub (local.get $nc) (local.get $jr))
                             (i32.ge_s (i32.sub (local.get $nc) (local.get $jr)) (i32.const 4))))
      (local.set $pb (i32.add (i32.const 589824) (i32.mul (i32.shr_u (local.get $jr) (i32.const 2)) (local.get $sl))))
      (local.set $ir (i32.const 0))
      (if (i32.and (local.get $lower) (i32.gt_s (local.get $j) (local.get $ic)))
        (then (local.set $ir (i32.sub (local.get $j) (local.get $ic)))))
      (block $ID (loop $I
        (br_if $ID (i32.ge_s (local.get $ir) (local.get $mc)))
        (local.set $i (i32.add (local.get $ic) (local.get $ir)))
        (local.set $mr (select (i32.const 4) (i32.sub (local.get $mc) (local.get $ir))
                               (i32.ge_s (i32.sub (local.get $mc) (local.get $ir)) (i32.const 4))))
        (local.set $pc (i32.add (i32.add (local.get $c) (i32.shl (local.get $i) (i32.const 3)))
                                (i32.mul (local.get $j) (local.get $ldc))))
        (if (i32.and (i32.eq (local.get $mr) (i32.const 4)) (i32.eq (local.get $nr) (i32.const 4)))
          (then
            (call $tile44 (local.get $kc)
              (i32.add (i32.const 327680) (i32.mul (i32.shr_u (local.get $ir) (i32.const 2)) (local.get $sl)))
              (i32.const 32) (local.get $pb) (i32.const 32) (local.get $pc) (local.get $ldc)
              (i32.and (local.get $lower) (i32.eq (local.get $i) (local.get $j)))))
          (else
            (call $tile44 (local.get $kc)
              (i32.add (i32.const 327680) (i32.mul (i32.shr_u (local.get $ir) (i32.const 2)) (local.get $sl)))
              (i32.const 32) (local.get $pb) (i32.const 32) (i32.const 0) (i32.const 0) (i32.const 2))
            (call $flush (local.get $mr) (local.get $nr) (local.get $pc) (local.get $ldc)
              (select (i32.sub (local.get $i) (local.get $j)) (i32.const 0x40000000) (local.get $lower)))))
        (local.set $ir (i32.add (local.get $ir) (i32.const 4)))
        (br $I)))
      (local.set $jr (i32.add (local.get $jr) (i32.const 4)))
      (br $J))))

  ;; C −= A·Bᵀ with packing: panels of B (NC × KC), slabs of A (MC × KC).
  (func $gemm_packed (param $m i32) (param $n i32) (param $k i32) (param $a i32) (param $lda i32)
                     (param $b i32) (param $ldb i32) (param $c i32) (param $ldc i32) (param $lower i32)
    (local $jc i32) (local $nc i32) (local $pc i32) (local $kc i32) (local $ic i32) (local $mc i32)
    (block $JD (loop $J
      (br_if $JD (i32.ge_s (local.get $jc) (local.get $n)))
      (local.set $nc (select (i32.const 512) (i32.sub (local.get $n) (local.get $jc))
                             (i32.ge_s (i32.sub (local.get $n) (local.get $jc)) (i32.const 512))))
      (local.set $pc (i32.const 0))
      (block $PD (loop $P
        (br_if $PD (i32.ge_s (local.get $pc) (local.get $k)))
        (local.set $kc (select (i32.const 256) (i32.sub (local.get $k) (local.get $pc))
                               (i32.ge_s (i32.sub (local.get $k) (local.get $pc)) (i32.const 256))))
        (call $pack (local.get $nc) (local.get $kc)
          (i32.add (i32.add (local.get $b) (i32.shl (local.get $jc) (i32.const 3)))
                   (i32.mul (local.get $pc) (local.get $ldb)))
          (local.get $ldb) (i32.const 589824))
        (local.set $ic (select (local.get $jc) (i32.const 0) (local.get $lower)))
        (block $ID (loop $I
          (br_if $ID (i32.ge_s (local.get $ic) (local.get $m)))
          (local.set $mc (select (i32.const 128) (i32.sub (local.get $m) (local.get $ic))
                                 (i32.ge_s (i32.sub (local.get $m) (local.get $ic)) (i32.const 128))))
          (call $pack (local.get $mc) (local.get $kc)
            (i32.add (i32.add (local.get $a) (i32.shl (local.get $ic) (i32.const 3)))
                     (i32.mul (local.get $pc) (local.get $lda)))
            (local.get $lda) (i32.const 327680))
          (call $macro (local.get $ic) (local.get $mc) (local.get $jc) (local.get $nc) (local.get $kc)
            (local.get $c) (local.get $ldc) (local.get $lower))
          (local.set $ic (i32.add (local.get $ic) (local.get $mc)))
          (br $I)))
        (local.set $pc (i32.add (local.get $pc) (local.get $kc)))
        (br $P)))
      (local.set $jc (i32.add (local.get $jc) (local.get $nc)))
      (br $J))))

  ;; C −= A·Bᵀ (A m×k, B n×k, C m×n); lower ≠ 0: only i ≥ j of C (m = n).
  ;; Strides in bytes. Operands with fewer than 12 rows on either side go
  ;; unpacked (the copy would cost as much as it saves).
  (func $gemm_b (param $m i32) (param $n i32) (param $k i32) (param $a i32) (param $lda i32)
                (param $b i32) (param $ldb i32) (param $c i32) (param $ldc i32) (param $lower i32)
    (if (i32.or (i32.or (i32.le_s (local.get $m) (i32.const 0)) (i32.le_s (local.get $n) (i32.const 0)))
                (i32.le_s (local.get $k) (i32.const 0)))
      (then (return)))
    (if (i32.or (i32.lt_s (local.get $m) (i32.const 12)) (i32.lt_s (local.get $n) (i32.const 12)))
      (then (call $gemm_direct (local.get $m) (local.get $n) (local.get $k) (local.get $a) (local.get $lda)
              (local.get $b) (local.get $ldb) (local.get $c) (local.get $ldc) (local.get $lower)))
      (else (call $gemm_packed (local.get $m) (local.get $n) (local.get $k) (local.get $a) (local.get $lda)
              (local.get $b) (local.get $ldb) (local.get $c) (local.get $ldc) (local.get $lower)))))

  (func (export "gemm") (param $m i32) (param $n i32) (param $k i32) (param $a i32) (param $lda i32)
                        (param $b i32) (param $ldb i32) (param $c i32) (param $ldc i32) (param $lower i32)
    (call $gemm_b (local.get $m) (local.get $n) (local.get $k)
      (local.get $a) (i32.shl (local.get $lda) (i32.const 3))
      (local.get $b) (i32.shl (local.get $ldb) (i32.const 3))
      (local.get $c) (i32.shl (local.get $ldc) (i32.const 3)) (local.get $lower)))

  ;; ---------------------------------------------------------------------
  ;; y[0:len] −= alpha · x[0:len] (contiguous), two lanes at a time.
  (func $axpy (param $len i32) (param $alpha f64) (param $x i32) (param $y i32)
    (local $va v128) (local $end i32)
    (local.set $va (f64x2.splat (local.get $alpha)))
    (local.set $end (i32.add (local.get $y) (i32.shl (i32.and (local.get $len) (i32.const -2)) (i32.const 3))))
    (block $D (loop $L
      (br_if $D (i32.eq (local.get $y) (local.get $end)))
      (v128.store (local.get $y) (f64x2.sub (v128.load (local.get $y))
                                            (f64x2.mul (local.get $va) (v128.load (local.get $x)))))
      (local.set $x (i32.add (local.get $x) (i32.const 16)))
      (local.set $y (i32.add (local.get $y) (i32.const 16)))
      (br $L)))
    (if (i32.and (local.get $len) (i32.const 1))
      (then (f64.store (local.get $y) (f64.sub (f64.load (local.get $y))
                                               (f64.mul (local.get $alpha) (f64.load (local.get $x))))))))

  ;; x[0:len] *= alpha (contiguous).
  (func $scal (param $len i32) (param $alpha f64) (param $x i32)
    (local $va v128) (local $end i32)
    (local.set $va (f64x2.splat (local.get $alpha)))
    (local.set $end (i32.add (local.get $x) (i32.shl (i32.and (local.get $len) (i32.const -2)) (i32.const 3))))
    (block $D (loop $L
      (br_if $D (i32.eq (local.get $x) (local.get $end)))
      (v128.store (local.get $x) (f64x2.mul (v128.load (local.get $x)) (local.get $va)))
      (local.set $x (i32.add (local.get $x) (i32.const 16)))
      (br $L)))
    (if (i32.and (local.get $len) (i32.const 1))
      (then (f64.store (local.get $x) (f64.mul (f64.load (local.get $x)) (local.get $alpha))))))

  ;; ---------------------------------------------------------------------
  ;; Unblocked right-looking Cholesky of the n×n lower triangle at a (lda in
  ;; bytes). Returns -1, or the column whose pivot d was not > 0 (d is left
  ;; on the diagonal, not rooted; NaN counts as failure).
  (func $potf2 (param $n i32) (param $a i32) (param $lda i32) (result i32)
    (local $j i32) (local $q i32) (local $d f64) (local $s f64) (local $ajj i32) (local $aqq i32)
    (block $JD (loop $J
      (br_if $JD (i32.ge_s (local.get $j) (local.get $n)))
      (local.set $ajj (i32.add (i32.add (local.get $a) (i32.shl (local.get $j) (i32.const 3)))
                               (i32.mul (local.get $j) (local.get $lda))))
      (local.set $d (f64.load (local.get $ajj)))
      (if (i32.eqz (i32.and (f64.gt (local.get $d) (f64.const 0)) (f64.lt (local.get $d) (f64.const inf))))
        (then (return (local.get $j))))
      (local.set $s (f64.sqrt (local.get $d)))
      (f64.store (local.get $ajj) (local.get $s))
      (call $scal (i32.sub (i32.sub (local.get $n) (local.get $j)) (i32.const 1))
        (f64.div (f64.const 1) (local.get $s)) (i32.add (local.get $ajj) (i32.const 8)))
      ;; A[q:n, q] −= A[q:n, j] · A[q, j] for q > j
      (local.set $q (i32.add (local.get $j) (i32.const 1)))
      (local.set $aqq (i32.add (local.get $ajj) (i32.add (local.get $lda) (i32.const 8))))
      (block $QD (loop $Q
        (br_if $QD (i32.ge_s (local.get $q) (local.get $n)))
        (call $axpy (i32.sub (local.get $n) (local.get $q))
          (f64.load (i32.add (local.get $ajj) (i32.shl (i32.sub (local.get $q) (local.get $j)) (i32.const 3))))
          (i32.add (local.get $ajj) (i32.shl (i32.sub (local.get $q) (local.get $j)) (i32.const 3)))
          (local.get $aqq))
        (local.set $aqq (i32.add (local.get $aqq) (i32.add (local.get $lda) (i32.const 8))))
        (local.set $q (i32.add (local.get $q) (i32.const 1)))
        (br $Q)))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $J)))
    (i32.const -1))

  ;; ---------------------------------------------------------------------
  ;; B := B · L⁻ᵀ, B m×n at b, L n×n lower at a; unit ≠ 0 takes diag(L) = 1.
  ;; Left-looking in blocks of nb columns: the update from earlier columns is
  ;; one GEMM; the diagonal block is solved the same way in blocks of 4 (so
  ;; almost all of its work also runs in the 4×4 tile), and a 4-column block
  ;; by column axpys. Strides in bytes.
  (func $trsm_b (param $m i32) (param $n i32) (param $a i32) (param $lda i32)
                (param $b i32) (param $ldb i32) (param $unit i32) (param $nb i32)
    (local $j0 i32) (local $jb i32) (local $j i32) (local $p i32) (local $bj i32)
    (if (i32.or (i32.le_s (local.get $m) (i32.const 0)) (i32.le_s (local.get $n) (i32.const 0)))
      (then (return)))
    (block $BD (loop $B
      (br_if $BD (i32.ge_s (local.get $j0) (local.get $n)))
      (local.set $jb (select (local.get $nb) (i32.sub (local.get $n) (local.get $j0))
                             (i32.ge_s (i32.sub (local.get $n) (local.get $j0)) (local.get $nb))))
      ;; B[:, j0:j0+jb] −= B[:, 0:j0] · L[j0:j0+jb, 0:j0]ᵀ
      (call $gemm_b (local.get $m) (local.get $jb) (local.get $j0)
        (local.get $b) (local.get $ldb)
        (i32.add (local.get $a) (i32.shl (local.get $j0) (i32.const 3))) (local.get $lda)
        (i32.add (local.get $b) (i32.mul (local.get $j0) (local.get $ldb))) (local.get $ldb)
        (i32.const 0))
      (if (i32.gt_s (local.get $nb) (i32.const 4))
        (then
          (call $trsm_b (local.get $m) (local.get $jb)
            (i32.add (i32.add (local.get $a) (i32.shl (local.get $j0) (i32.const 3)))
                     (i32.mul (local.get $j0) (local.get $lda)))
            (local.get $lda)
            (i32.add (local.get $b) (i32.mul (local.get $j0) (local.get $ldb))) (local.get $ldb)
            (local.get $unit) (i32.const 4)))
        (else
          (local.set $j (local.get $j0))
          (block $JD (loop $J
            (br_if $JD (i32.ge_s (local.get $j) (i32.add (local.get $j0) (local.get $jb))))
            (local.set $bj (i32.add (local.get $b) (i32.mul (local.get $j) (local.get $ldb))))
            (local.set $p (local.get $j0))
            (block $PD (loop $P
              (br_if $PD (i32.ge_s (local.get $p) (local.get $j)))
              (call $axpy (local.get $m)
                (f64.load (i32.add (i32.add (local.get $a) (i32.shl (local.get $j) (i32.const 3)))
                                   (i32.mul (local.get $p) (local.get $lda))))
                (i32.add (local.get $b) (i32.mul (local.get $p) (local.get $ldb)))
                (local.get $bj))
              (local.set $p (i32.add (local.get $p) (i32.const 1)))
              (br $P)))
            (if (i32.eqz (local.get $unit))
              (then (call $scal (local.get $m)
                (f64.div (f64.const 1)
                  (f64.load (i32.add (i32.add (local.get $a) (i32.shl (local.get $j) (i32.const 3)))
                                     (i32.mul (local.get $j) (local.get $lda)))))
                (local.get $bj))))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $J)))))
      (local.set $j0 (i32.add (local.get $j0) (local.get $jb)))
      (br $B))))

  (func (export "trsm") (param $m i32) (param $n i32) (param $a i32) (param $lda i32)
                        (param $b i32) (param $ldb i32) (param $unit i32)
    (call $trsm_b (local.get $m) (local.get $n) (local.get $a) (i32.shl (local.get $lda) (i32.const 3))
      (local.get $b) (i32.shl (local.get $ldb) (i32.const 3)) (local.get $unit) (i32.const 32)))

  ;; ---------------------------------------------------------------------
  ;; Blocked right-looking Cholesky in blocks of nb: factor the diagonal
  ;; block (recursively in blocks of 32 when nb > 32, else unblocked), solve
  ;; the panel below it, update the trailing lower triangle (SYRK). Two levels
  ;; (256, then 32) keep the SYRK deep enough (k = 256) that the trailing
  ;; matrix is not streamed from memory once per 32 columns. lda in bytes.
  (func $potrf_r (param $n i32) (param $a i32) (param $lda i32) (param $nb i32) (result i32)
    (local $j0 i32) (local $jb i32) (local $info i32) (local $d i32) (local $r i32) (local $rest i32)
    (block $BD (loop $B
      (br_if $BD (i32.ge_s (local.get $j0) (local.get $n)))
      (local.set $jb (select (local.get $nb) (i32.sub (local.get $n) (local.get $j0))
                             (i32.ge_s (i32.sub (local.get $n) (local.get $j0)) (local.get $nb))))
      (local.set $d (i32.add (i32.add (local.get $a) (i32.shl (local.get $j0) (i32.const 3)))
                             (i32.mul (local.get $j0) (local.get $lda))))
      (local.set $info
        (if (result i32) (i32.gt_s (local.get $nb) (i32.const 32))
          (then (call $potrf_r (local.get $jb) (local.get $d) (local.get $lda) (i32.const 32)))
          (else (call $potf2 (local.get $jb) (local.get $d) (local.get $lda)))))
      (if (i32.ge_s (local.get $info) (i32.const 0))
        (then (return (i32.add (local.get $j0) (local.get $info)))))
      (local.set $rest (i32.sub (i32.sub (local.get $n) (local.get $j0)) (local.get $jb)))
      (local.set $r (i32.add (local.get $d) (i32.shl (local.get $jb) (i32.const 3))))
      (call $trsm_b (local.get $rest) (local.get $jb) (local.get $d) (local.get $lda)
        (local.get $r) (local.get $lda) (i32.const 0) (i32.const 32))
      (call $gemm_b (local.get $rest) (local.get $rest) (local.get $jb)
        (local.get $r) (local.get $lda) (local.get $r) (local.get $lda)
        (i32.add (local.get $r) (i32.mul (local.get $jb) (local.get $lda))) (local.get $lda)
        (i32.const 1))
      (local.set $j0 (i32.add (local.get $j0) (local.get $jb)))
      (br $B)))
    (i32.const -1))

  (func (export "potrf") (param $n i32) (param $a i32) (param $lda i32) (result i32)
    (call $potrf_r (local.get $n) (local.get $a) (i32.shl (local.get $lda) (i32.const 3)) (i32.const 256)))

  ;; ---------------------------------------------------------------------
  ;; Unblocked right-looking L·D·Lᵀ of the n×n lower triangle at a (lda in
  ;; bytes). Returns -1 or the column whose pivot had |d| ≤ tiny (or was not finite).
  (func $ldl2 (param $n i32) (param $a i32) (param $lda i32) (param $tiny f64) (result i32)
    (local $j i32) (local $q i32) (local $d f64) (local $ajj i32) (local $aqq i32) (local $aq i32)
    (block $JD (loop $J
      (br_if $JD (i32.ge_s (local.get $j) (local.get $n)))
      (local.set $ajj (i32.add (i32.add (local.get $a) (i32.shl (local.get $j) (i32.const 3)))
                               (i32.mul (local.get $j) (local.get $lda))))
      (local.set $d (f64.load (local.get $ajj)))
      (if (i32.eqz (i32.and (f64.gt (f64.abs (local.get $d)) (local.get $tiny))
                           (f64.lt (f64.abs (local.get $d)) (f64.const inf))))
        (then (return (local.get $j))))
      ;; A[q:n, q] −= A[q:n, j] · (A[q, j] / d) for q > j, then scale column j by 1/d
      (local.set $q (i32.add (local.get $j) (i32.const 1)))
      (local.set $aqq (i32.add (local.get $ajj) (i32.add (local.get $lda) (i32.const 8))))
      (block $QD (loop $Q
        (br_if $QD (i32.ge_s (local.get $q) (local.get $n)))
        (local.set $aq (i32.add (local.get $ajj) (i32.shl (i32.sub (local.get $q) (local.get $j)) (i32.const 3))))
        (call $axpy (i32.sub (local.get $n) (local.get $q))
          (f64.div (f64.load (local.get $aq)) (local.get $d)) (local.get $aq) (local.get $aqq))
        (local.set $aqq (i32.add (local.get $aqq) (i32.add (local.get $lda) (i32.const 8))))
        (local.set $q (i32.add (local.get $q) (i32.const 1)))
        (br $Q)))
      (call $scal (i32.sub (i32.sub (local.get $n) (local.get $j)) (i32.const 1))
        (f64.div (f64.const 1) (local.get $d)) (i32.add (local.get $ajj) (i32.const 8)))
      (local.set $j (i32.add (local.get $j) (i32.const 1)))
      (br $J)))
    (i32.const -1))

  ;; ---------------------------------------------------------------------
  ;; Trailing update of blocked L·D·Lᵀ. The panel W (rest × jb at w) holds
  ;; L21·D1 (after the unit triangular solve); d points at the diagonal block
  ;; (D1 on its diagonal). A22 −= (W·D1⁻¹)·Wᵀ, in chunks of 128 rows: the chunk
  ;; W[r0:r1]·D1⁻¹ is formed in scratch at address 0 (128 × jb ≤ 256 doubles), then
  ;; one GEMM for the block left of the diagonal and one lower GEMM on it.
  (func $ldlt_update (param $rest i32) (param $jb i32) (param $d i32) (param $w i32)
                     (param $c i32) (param $lda i32)
    (local $r0 i32) (local $r1 i32) (local $rc i32) (local $p i32) (local $i i32) (local $dinv f64)
    (block $RD (loop $R
      (br_if $RD (i32.ge_s (local.get $r0) (local.get $rest)))
      (local.set $r1 (select (i32.add (local.get $r0) (i32.const 128)) (local.get $rest)
                             (i32.lt_s (i32.add (local.get $r0) (i32.const 128)) (local.get $rest))))
      (local.set $rc (i32.sub (local.get $r1) (local.get $r0)))
      (local.set $p (i32.const 0))
      (block $PD (loop $P
        (br_if $PD (i32.ge_s (local.get $p) (local.get $jb)))
        (local.set $dinv (f64.div (f64.const 1)
          (f64.load (i32.add (i32.add (local.get $d) (i32.shl (local.get $p) (i32.const 3)))
                             (i32.mul (local.get $p) (local.get $lda))))))
        (local.set $i (i32.const 0))
        (block $ID (loop $I
          (br_if $ID (i32.ge_s (local.get $i) (local.get $rc)))
          (f64.store (i32.shl (i32.add (local.get $i) (i32.mul (local.get $p) (i32.const 128))) (i32.const 3))
            (f64.mul (local.get $dinv)
              (f64.load (i32.add (i32.add (local.get $w) (i32.mul (local.get $p) (local.get $lda)))
                                 (i32.shl (i32.add (local.get $r0) (local.get $i)) (i32.const 3))))))
          (local.set $i (i32.add (local.get $i) (i32.const 1)))
          (br $I)))
        (local.set $p (i32.add (local.get $p) (i32.const 1)))
        (br $P)))
      ;; rows r0:r1, columns 0:r0 (full) and r0:r1 (lower)
      (call $gemm_b (local.get $rc) (local.get $r0) (local.get $jb) (i32.const 0) (i32.const 1024)
        (local.get $w) (local.get $lda)
        (i32.add (local.get $c) (i32.shl (local.get $r0) (i32.const 3))) (local.get $lda) (i32.const 0))
      (call $gemm_b (local.get $rc) (local.get $rc) (local.get $jb) (i32.const 0) (i32.const 1024)
        (i32.add (local.get $w) (i32.shl (local.get $r0) (i32.const 3))) (local.get $lda)
        (i32.add (i32.add (local.get $c) (i32.shl (local.get $r0) (i32.const 3)))
                 (i32.mul (local.get $r0) (local.get $lda))) (local.get $lda) (i32.const 1))
      (local.set $r0 (local.get $r1))
      (br $R))))

  ;; Blocked right-looking L·D·Lᵀ without pivoting in blocks of nb (256,
  ;; then 32 inside the diagonal block, as for Cholesky). lda in bytes.
  (func $ldlt_r (param $n i32) (param $a i32) (param $lda i32) (param $tiny f64) (param $nb i32) (result i32)
    (local $j0 i32) (local $jb i32) (local $info i32) (local $d i32) (local $r i32) (local $rest i32)
    (local $p i32)
    (block $BD (loop $B
      (br_if $BD (i32.ge_s (local.get $j0) (local.get $n)))
      (local.set $jb (select (local.get $nb) (i32.sub (local.get $n) (local.get $j0))
                             (i32.ge_s (i32.sub (local.get $n) (local.get $j0)) (local.get $nb))))
      (local.set $d (i32.add (i32.add (local.get $a) (i32.shl (local.get $j0) (i32.const 3)))
                             (i32.mul (local.get $j0) (local.get $lda))))
      (local.set $info
        (if (result i32) (i32.gt_s (local.get $nb) (i32.const 32))
          (then (call $ldlt_r (local.get $jb) (local.get $d) (local.get $lda) (local.get $tiny) (i32.const 32)))
          (else (call $ldl2 (local.get $jb) (local.get $d) (local.get $lda) (local.get $tiny)))))
      (if (i32.ge_s (local.get $info) (i32.const 0))
        (then (return (i32.add (local.get $j0) (local.get $info)))))
      (local.set $rest (i32.sub (i32.sub (local.get $n) (local.get $j0)) (local.get $jb)))
      (local.set $r (i32.add (local.get $d) (i32.shl (local.get $jb) (i32.const 3))))
      (call $trsm_b (local.get $rest) (local.get $jb) (local.get $d) (local.get $lda)
        (local.get $r) (local.get $lda) (i32.const 1) (i32.const 32))
      (call $ldlt_update (local.get $rest) (local.get $jb) (local.get $d) (local.get $r)
        (i32.add (local.get $r) (i32.mul (local.get $jb) (local.get $lda))) (local.get $lda))
      ;; panel W = L21·D1 → L21
      (local.set $p (i32.const 0))
      (block $PD (loop $P
        (br_if $PD (i32.ge_s (local.get $p) (local.get $jb)))
        (call $scal (local.get $rest)
          (f64.div (f64.const 1)
            (f64.load (i32.add (i32.add (local.get $d) (i32.shl (local.get $p) (i32.const 3)))
                               (i32.mul (local.get $p) (local.get $lda)))))
          (i32.add (local.get $r) (i32.mul (local.get $p) (local.get $lda))))
        (local.set $p (i32.add (local.get $p) (i32.const 1)))
        (br $P)))
      (local.set $j0 (i32.add (local.get $j0) (local.get $jb)))
      (br $B)))
    (i32.const -1))

  (func (export "ldlt") (param $n i32) (param $a i32) (param $lda i32) (param $tiny f64) (result i32)
    (call $ldlt_r (local.get $n) (local.get $a) (i32.shl (local.get $lda) (i32.const 3)) (local.get $tiny)
      (i32.const 256)))
)
