;; The k-means++ trial sweep (measureTrials in seeding.ts) for four trials: every row's squared
;; distance to each trial is stored, and each trial's total of min(distance, the row's own nearest
;; distance) is summed in row order. Two-lane float64 vectors hold two trials; each distance is
;; summed in column order from 0 with separate multiply and add, so every number is bit for bit
;; what the JavaScript sweep gives. A vector select adds the smaller of the two distances.
;;
;;   rows: byte offset of the first row; trials: the four trial rows interleaved in pairs (as the
;;   centres of pair-scan.wat); closest: the rows' own nearest squared distances; count: row
;;   pairs (the caller measures an odd last row itself); rowBytes = 8 × columns; stored: where
;;   row i's four distances go, rows storedStride bytes apart; totals: the four totals.
(module
  (import "env" "memory" (memory 0 65536))
  (func (export "trialTotals")
    (param $rows i32) (param $trials i32) (param $closest i32) (param $count i32)
    (param $rowBytes i32) (param $stored i32) (param $storedStride i32) (param $totals i32)
    (local $u i32) (local $nextRow i32)
    (local $own0 v128) (local $own1 v128) (local $x v128)
    (local $a01 v128) (local $a23 v128) (local $b01 v128) (local $b23 v128) (local $e v128)
    (local $total01 v128) (local $total23 v128) (local $c01 v128) (local $c23 v128)
    (local.set $total01 (v128.const i64x2 0 0))
    (local.set $total23 (v128.const i64x2 0 0))
    (block $done
      (br_if $done (i32.eqz (local.get $count)))
      (loop $pair
        (local.set $own0 (f64x2.splat (f64.load (local.get $closest))))
        (local.set $own1 (f64x2.splat (f64.load offset=8 (local.get $closest))))
        (local.set $nextRow (i32.add (local.get $rows) (local.get $rowBytes)))
        ;; The column loop (the same text as in pair-scan.wat), row A = $rows, row B = $nextRow.
        (local.set $a01 (v128.const i64x2 0 0))
        (local.set $a23 (v128.const i64x2 0 0))
        (local.set $b01 (v128.const i64x2 0 0))
        (local.set $b23 (v128.const i64x2 0 0))
        (local.set $u (i32.const 0))
        (loop $column
          (local.set $c01 (v128.load (i32.add (local.get $trials) (i32.shl (local.get $u) (i32.const 1)))))
          (local.set $c23 (v128.load (i32.add (local.get $trials)
            (i32.shl (i32.add (local.get $rowBytes) (local.get $u)) (i32.const 1)))))
          (local.set $x (f64x2.splat (f64.load (i32.add (local.get $rows) (local.get $u)))))
          (local.set $a01 (f64x2.add (local.get $a01)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c01))) (local.get $e))))
          (local.set $a23 (f64x2.add (local.get $a23)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c23))) (local.get $e))))
          (local.set $x (f64x2.splat (f64.load (i32.add (local.get $nextRow) (local.get $u)))))
          (local.set $b01 (f64x2.add (local.get $b01)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c01))) (local.get $e))))
          (local.set $b23 (f64x2.add (local.get $b23)
            (f64x2.mul (local.tee $e (f64x2.sub (local.get $x) (local.get $c23))) (local.get $e))))
          (br_if $column
            (i32.lt_u (local.tee $u (i32.add (local.get $u) (i32.const 8))) (local.get $rowBytes))))
        (v128.store (local.get $stored) (local.get $a01))
        (v128.store offset=16 (local.get $stored) (local.get $a23))
        (local.set $u (i32.add (local.get $stored) (local.get $storedStride)))
        (v128.store (local.get $u) (local.get $b01))
        (v128.store offset=16 (local.get $u) (local.get $b23))
        ;; Row order within each total: the first row of the pair, then the second.
        (local.set $total01 (f64x2.add (local.get $total01)
          (v128.bitselect (local.get $a01) (local.get $own0) (f64x2.lt (local.get $a01) (local.get $own0)))))
        (local.set $total23 (f64x2.add (local.get $total23)
          (v128.bitselect (local.get $a23) (local.get $own0) (f64x2.lt (local.get $a23) (local.get $own0)))))
        (local.set $total01 (f64x2.add (local.get $total01)
          (v128.bitselect (local.get $b01) (local.get $own1) (f64x2.lt (local.get $b01) (local.get $own1)))))
        (local.set $total23 (f64x2.add (local.get $total23)
          (v128.bitselect (local.get $b23) (local.get $own1) (f64x2.lt (local.get $b23) (local.get $own1)))))
        (local.set $rows (i32.add (local.get $nextRow) (local.get $rowBytes)))
        (local.set $closest (i32.add (local.get $closest) (i32.const 16)))
        (local.set $stored (i32.add (local.get $u) (local.get $storedStride)))
        (br_if $pair (local.tee $count (i32.sub (local.get $count) (i32.const 1))))))
    (v128.store (local.get $totals) (local.get $total01))
    (v128.store offset=16 (local.get $totals) (local.get $total23))))
