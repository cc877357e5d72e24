;; Segment sums and counts of a range of rows (blockSums in centre-update.ts): each row's columns
;; are added to its segment's sums two at a time with two-lane float64 vectors. The lanes are
;; independent additions in row order, so every sum is bit for bit what the JavaScript loop
;; gives. The caller clears `sums` and `counts` first.
;;
;;   rows, assignment, sums, counts: byte offsets; count: rows; rowBytes = 8 × columns;
;;   pairBytes = 16 × floor(columns / 2) (an odd last column is added on its own).
(module
  (import "env" "memory" (memory 0 65536))
  (func (export "segmentSums")
    (param $rows i32) (param $assignment i32) (param $sums i32) (param $counts i32)
    (param $count i32) (param $rowBytes i32) (param $pairBytes i32)
    (local $segmentSums i32) (local $u i32) (local $countAt i32)
    (block $done
      (br_if $done (i32.eqz (local.get $count)))
      (loop $row
        (local.set $segmentSums
          (i32.add (local.get $sums) (i32.mul (i32.load (local.get $assignment)) (local.get $rowBytes))))
        ;; counts[a] += 1
        (f64.store
          (local.tee $countAt
            (i32.add (local.get $counts) (i32.shl (i32.load (local.get $assignment)) (i32.const 3))))
          (f64.add (f64.load (local.get $countAt)) (f64.const 1)))
        (local.set $u (i32.const 0))
        (block $pairsDone
          (br_if $pairsDone (i32.eqz (local.get $pairBytes)))
          (loop $pair
            (v128.store (i32.add (local.get $segmentSums) (local.get $u))
              (f64x2.add
                (v128.load (i32.add (local.get $segmentSums) (local.get $u)))
                (v128.load (i32.add (local.get $rows) (local.get $u)))))
            (br_if $pair
              (i32.lt_u (local.tee $u (i32.add (local.get $u) (i32.const 16))) (local.get $pairBytes)))))
        (if (i32.lt_u (local.get $u) (local.get $rowBytes))
          (then
            (f64.store (i32.add (local.get $segmentSums) (local.get $u))
              (f64.add
                (f64.load (i32.add (local.get $segmentSums) (local.get $u)))
                (f64.load (i32.add (local.get $rows) (local.get $u)))))))
        (local.set $rows (i32.add (local.get $rows) (local.get $rowBytes)))
        (local.set $assignment (i32.add (local.get $assignment) (i32.const 4)))
        (br_if $row (local.tee $count (i32.sub (local.get $count) (i32.const 1))))))))
