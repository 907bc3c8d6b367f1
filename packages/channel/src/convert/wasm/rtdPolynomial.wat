;; bridgework: the RTD polynomial loop of @bridgework/channel/rtd-polynomial in WebAssembly.
;;
;; For the Int32 codes x = codes[k], k = 0…n−1: r = x − base, the segment's slot
;; ((r >> shift) & slotMask) of 64 bytes (eight binary64 c0…c7) in the table at `table`, the offset
;; d = (r & offsetMask) − half, then out[k] = c0 + (c1 + d·(c2 + d·c3 + d²·(c4 + d·c5 + d²·(c6 + d·c7))))
;; with d² = d·d: the expression `segmentValue` of ../rtdPolynomial.ts, operation for operation
;; (binary64, no fused multiply-add), so every result is bit-identical to the JavaScript loop and
;; to what the segment's check evaluated. Per block of 256 codes it writes one byte at `marks`: 1
;; when some code lies outside [lowI, highI] (the sign bit of (x − lowI) | (highI − x)) or some
;; value is not finite (a slot not checked yet, or sent to the exact loop, holds NaN); the caller
;; converts those blocks again sample by sample. Returns the number of marked blocks. Codes,
;; outputs, table and marks live in the memory the module imports (env.memory), little-endian.
(module
  (memory (import "env" "memory") 1)
  (func (export "poly")
    (param $codes i32) (param $out i32) (param $n i32) (param $table i32) (param $marks i32)
    (param $base i32) (param $shift i32) (param $offsetMask i32) (param $half i32) (param $slotMask i32)
    (param $lowI i32) (param $highI i32)
    (result i32)
    (local $end i32) (local $blockEnd i32) (local $x i32) (local $r i32) (local $j i32) (local $flags i32)
    (local $bad i32) (local $d f64) (local $d2 f64) (local $v f64) (local $finite f64)
    (local.set $end (i32.add (local.get $codes) (i32.shl (local.get $n) (i32.const 2))))
    (block $all
      (loop $blocks
        (br_if $all (i32.ge_u (local.get $codes) (local.get $end)))
        ;; a block of 256 codes (1024 bytes), or what remains
        (local.set $blockEnd (i32.add (local.get $codes) (i32.const 1024)))
        (if (i32.gt_u (local.get $blockEnd) (local.get $end)) (then (local.set $blockEnd (local.get $end))))
        (local.set $flags (i32.const 0))
        (local.set $finite (f64.const 0))
        (block $done
          (loop $one
            (br_if $done (i32.ge_u (local.get $codes) (local.get $blockEnd)))
            (local.set $x (i32.load (local.get $codes)))
            (local.set $r (i32.sub (local.get $x) (local.get $base)))
            (local.set $flags (i32.or (local.get $flags)
              (i32.or (i32.sub (local.get $x) (local.get $lowI)) (i32.sub (local.get $highI) (local.get $x)))))
            (local.set $j (i32.add (local.get $table)
              (i32.shl (i32.and (i32.shr_s (local.get $r) (local.get $shift)) (local.get $slotMask)) (i32.const 6))))
            (local.set $d (f64.convert_i32_s (i32.sub (i32.and (local.get $r) (local.get $offsetMask)) (local.get $half))))
            (local.set $d2 (f64.mul (local.get $d) (local.get $d)))
            (local.set $v
              (f64.add (f64.load (local.get $j))
                (f64.add (f64.load offset=8 (local.get $j))
                  (f64.mul (local.get $d)
                    (f64.add
                      (f64.add (f64.load offset=16 (local.get $j)) (f64.mul (local.get $d) (f64.load offset=24 (local.get $j))))
                      (f64.mul (local.get $d2)
                        (f64.add
                          (f64.add (f64.load offset=32 (local.get $j)) (f64.mul (local.get $d) (f64.load offset=40 (local.get $j))))
                          (f64.mul (local.get $d2)
                            (f64.add (f64.load offset=48 (local.get $j)) (f64.mul (local.get $d) (f64.load offset=56 (local.get $j))))))))))))
            (f64.store (local.get $out) (local.get $v))
            (local.set $finite (f64.add (local.get $finite) (f64.sub (local.get $v) (local.get $v))))
            (local.set $codes (i32.add (local.get $codes) (i32.const 4)))
            (local.set $out (i32.add (local.get $out) (i32.const 8)))
            (br $one)))
        ;; the block's mark: 1 when a code is outside [lowI, highI] or a value is not finite
        (local.set $x (i32.or (i32.lt_s (local.get $flags) (i32.const 0)) (f64.ne (local.get $finite) (f64.const 0))))
        (i32.store8 (local.get $marks) (local.get $x))
        (local.set $bad (i32.add (local.get $bad) (local.get $x)))
        (local.set $marks (i32.add (local.get $marks) (i32.const 1)))
        (br $blocks)))
    (local.get $bad))
)
