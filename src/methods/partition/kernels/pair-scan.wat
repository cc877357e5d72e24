;; The full scan of the Hamerly rows whose bounds fail (sweep in hamerly-sweep.ts): squared
;; distances of two rows to every centre. Two-lane float64 vectors hold two centres; each distance
;; is summed in column order from 0 with separate multiply and add, so every number is bit for
;; bit what twoByFour gives in JavaScript, one instruction serving two centres and each centre
;; load serving both rows.
;;
;;   rowA, rowB: byte offsets of the two rows; centres: the padded centres interleaved in pairs,
;;   four to a group (in each group of four, centres 0 and 1 side by side column by column, then
;;   2 and 3); groups: how many groups of four; rowBytes = 8 × columns.
;;   For each group: outA[0..3], outB[0..3] = the rows' squared distances to its four centres.
(module
  (import "env" "memory" (memory 0 65536))
  (func (export "pairScan")
    (param $rowA i32) (param $rowB i32) (param $centres i32) (param $groups i32)
    (param $rowBytes i32) (param $outA i32) (param $outB i32)
    (local $u i32)
    (local $x v128) (local $e v128)
    (local $a01 v128) (local $a23 v128) (local $b01 v128) (local $b23 v128)
    (local $c01 v128) (local $c23 v128)
    (block $done
      (br_if $done (i32.eqz (local.get $groups)))
      (loop $group
        ;; The column loop (the same text as in trial-totals.wat): a01 / a23 collect row A's
        ;; squared distances to centres 0 and 1, 2 and 3; b01 / b23 row B's.
        (local.set $a01 (v128.const i64x2 0 0))
        (local.set $a23 (v128.const i64x2 0 0))
        (local.set $b01 (v128.const i64x2 0 0))
        (local.set $b23 (v128.const i64x2 0 0))
        (local.set $u (i32.const 0))
        (loop $column
          (local.set $c01 (v128.load (i32.add (local.get $centres) (i32.shl (local.get $u) (i32.const 1)))))
          (local.set $c23 (v128.load (i32.add (local.get $centres)
            (i32.shl (i32.add (local.get $rowBytes) (local.get $u)) (i32.const 1)))))
          (local.set $x (f64x2.splat (f64.load (i32.add (local.get $rowA) (local.get $u)))))
          (local.set $a01 (f64x2.add (local.get $a01)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c01))) (local.get $e))))
          (local.set $a23 (f64x2.add (local.get $a23)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c23))) (local.get $e))))
          (local.set $x (f64x2.splat (f64.load (i32.add (local.get $rowB) (local.get $u)))))
          (local.set $b01 (f64x2.add (local.get $b01)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c01))) (local.get $e))))
          (local.set $b23 (f64x2.add (local.get $b23)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c23))) (local.get $e))))
          (br_if $column
            (i32.lt_u (local.tee $u (i32.add (local.get $u) (i32.const 8))) (local.get $rowBytes))))
        (v128.store (local.get $outA) (local.get $a01))
        (v128.store offset=16 (local.get $outA) (local.get $a23))
        (v128.store (local.get $outB) (local.get $b01))
        (v128.store offset=16 (local.get $outB) (local.get $b23))
        (local.set $outA (i32.add (local.get $outA) (i32.const 32)))
        (local.set $outB (i32.add (local.get $outB) (i32.const 32)))
        ;; The next group of four centres: 4 × columns values on.
        (local.set $centres (i32.add (local.get $centres) (i32.shl (local.get $rowBytes) (i32.const 2))))
        (br_if $group (local.tee $groups (i32.sub (local.get $groups) (i32.const 1))))))))
