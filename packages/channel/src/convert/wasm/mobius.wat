;; bridgework: the Möbius conversion kernel of @bridgework/channel in WebAssembly SIMD.
;;
;; out[k] = (a·x + b)/(c·x + d) for the Int32 codes x = codes[k], k = 0…n−1, in binary64 with the
;; operations of the JavaScript kernel in its order (multiply, add, multiply, add, divide; no fused
;; multiply-add), so every result is bit-identical to it. The codes and the outputs live in the
;; memory the module imports (env.memory): `codes` and `out` are byte offsets (Int32 and Float64,
;; little-endian). The result is the or of (x − lowI) | (highI − x) over the codes: negative when
;; some code lies outside [lowI, highI]; the caller then revisits those samples (NaN, counted).
(module
  (memory (import "env" "memory") 1)
  (func (export "mobius")
    (param $codes i32) (param $out i32) (param $n i32)
    (param $a f64) (param $b f64) (param $c f64) (param $d f64)
    (param $lowI i32) (param $highI i32)
    (result i32)
    (local $end8 i32) (local $end i32)
    (local $va v128) (local $vb v128) (local $vc v128) (local $vd v128)
    (local $vlow v128) (local $vhigh v128) (local $flags v128)
    (local $x0 v128) (local $x1 v128) (local $f v128)
    (local $s i32) (local $xs i32) (local $xf f64)
    (local.set $va (f64x2.splat (local.get $a)))
    (local.set $vb (f64x2.splat (local.get $b)))
    (local.set $vc (f64x2.splat (local.get $c)))
    (local.set $vd (f64x2.splat (local.get $d)))
    (local.set $vlow (i32x4.splat (local.get $lowI)))
    (local.set $vhigh (i32x4.splat (local.get $highI)))
    ;; codes end: codes + 4n; the eight-code loop runs while eight remain
    (local.set $end (i32.add (local.get $codes) (i32.shl (local.get $n) (i32.const 2))))
    (local.set $end8 (i32.add (local.get $codes) (i32.shl (i32.and (local.get $n) (i32.const -8)) (i32.const 2))))
    (block $done8
      (loop $eight
        (br_if $done8 (i32.ge_u (local.get $codes) (local.get $end8)))
        (local.set $x0 (v128.load (local.get $codes)))
        (local.set $x1 (v128.load offset=16 (local.get $codes)))
        (local.set $flags
          (v128.or (local.get $flags)
            (v128.or
              (v128.or (i32x4.sub (local.get $x0) (local.get $vlow)) (i32x4.sub (local.get $vhigh) (local.get $x0)))
              (v128.or (i32x4.sub (local.get $x1) (local.get $vlow)) (i32x4.sub (local.get $vhigh) (local.get $x1))))))
        ;; codes 0, 1
        (local.set $f (f64x2.convert_low_i32x4_s (local.get $x0)))
        (v128.store (local.get $out)
          (f64x2.div
            (f64x2.add (f64x2.mul (local.get $va) (local.get $f)) (local.get $vb))
            (f64x2.add (f64x2.mul (local.get $vc) (local.get $f)) (local.get $vd))))
        ;; codes 2, 3
        (local.set $f (f64x2.convert_low_i32x4_s
          (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $x0) (local.get $x0))))
        (v128.store offset=16 (local.get $out)
          (f64x2.div
            (f64x2.add (f64x2.mul (local.get $va) (local.get $f)) (local.get $vb))
            (f64x2.add (f64x2.mul (local.get $vc) (local.get $f)) (local.get $vd))))
        ;; codes 4, 5
        (local.set $f (f64x2.convert_low_i32x4_s (local.get $x1)))
        (v128.store offset=32 (local.get $out)
          (f64x2.div
            (f64x2.add (f64x2.mul (local.get $va) (local.get $f)) (local.get $vb))
            (f64x2.add (f64x2.mul (local.get $vc) (local.get $f)) (local.get $vd))))
        ;; codes 6, 7
        (local.set $f (f64x2.convert_low_i32x4_s
          (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $x1) (local.get $x1))))
        (v128.store offset=48 (local.get $out)
          (f64x2.div
            (f64x2.add (f64x2.mul (local.get $va) (local.get $f)) (local.get $vb))
            (f64x2.add (f64x2.mul (local.get $vc) (local.get $f)) (local.get $vd))))
        (local.set $codes (i32.add (local.get $codes) (i32.const 32)))
        (local.set $out (i32.add (local.get $out) (i32.const 64)))
        (br $eight)))
    ;; the sign bits of the folded flags, and the remaining codes one at a time
    (local.set $s (i32.sub (i32.const 0) (i32.ne (i32x4.bitmask (local.get $flags)) (i32.const 0))))
    (block $done
      (loop $one
        (br_if $done (i32.ge_u (local.get $codes) (local.get $end)))
        (local.set $xs (i32.load (local.get $codes)))
        (local.set $s (i32.or (local.get $s)
          (i32.or (i32.sub (local.get $xs) (local.get $lowI)) (i32.sub (local.get $highI) (local.get $xs)))))
        (local.set $xf (f64.convert_i32_s (local.get $xs)))
        (f64.store (local.get $out)
          (f64.div
            (f64.add (f64.mul (local.get $a) (local.get $xf)) (local.get $b))
            (f64.add (f64.mul (local.get $c) (local.get $xf)) (local.get $d))))
        (local.set $codes (i32.add (local.get $codes) (i32.const 4)))
        (local.set $out (i32.add (local.get $out) (i32.const 8)))
        (br $one)))
    (local.get $s)))
