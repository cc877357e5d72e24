;; The bound pass of a Hamerly sweep (sweep in hamerly-sweep.ts): every row's bounds follow the
;; last centre moves; a row whose upper bound is below max(lower bound, half the gap from its
;; centre to the nearest other) keeps its segment; otherwise its own distance is measured (column
;; order, as in JavaScript) and, if that still cannot rule a change out, the row is listed for
;; the full scan. The same comparisons and arithmetic as the JavaScript loop, so bounds and list
;; are bit for bit the same. Returns how many rows were listed.
;;
;;   assignment, upper, lower, rows: byte offsets of the block's first row; centres, moved,
;;   halfGap: the whole arrays; count: rows; rowBytes = 8 × columns; mostAt: the centre that
;;   moved most; first: the block's first row number; list: receives row numbers in increasing
;;   order; most, secondMost: the largest and second-largest centre moves.
(module
  (import "env" "memory" (memory 0 65536))
  (func (export "boundPass")
    (param $assignment i32) (param $upper i32) (param $lower i32) (param $rows i32)
    (param $centres i32) (param $moved i32) (param $halfGap i32) (param $count i32)
    (param $rowBytes i32) (param $mostAt i32) (param $row i32) (param $list i32)
    (param $most f64) (param $secondMost f64)
    (result i32)
    (local $a i32) (local $centre i32) (local $u i32) (local $listed i32)
    (local $up f64) (local $low f64) (local $gap f64) (local $bound f64) (local $own f64) (local $diff f64)
    (local.set $listed (i32.const 0))
    (block $done
      (br_if $done (i32.eqz (local.get $count)))
      (loop $next
        (local.set $a (i32.load (local.get $assignment)))
        ;; up = upper + moved[a]
        (local.set $up (f64.add
          (f64.load (local.get $upper))
          (f64.load (i32.add (local.get $moved) (i32.shl (local.get $a) (i32.const 3))))))
        ;; lower = low = lower − (a = mostAt ? secondMost : most)
        (f64.store (local.get $lower)
          (local.tee $low (f64.sub
            (f64.load (local.get $lower))
            (select (local.get $secondMost) (local.get $most) (i32.eq (local.get $a) (local.get $mostAt))))))
        ;; bound = halfGap[a] > low ? halfGap[a] : low
        (local.set $bound (select
          (local.tee $gap (f64.load (i32.add (local.get $halfGap) (i32.shl (local.get $a) (i32.const 3)))))
          (local.get $low)
          (f64.gt (local.get $gap) (local.get $low))))
        (if (f64.lt (local.get $up) (local.get $bound))
          (then (f64.store (local.get $upper) (local.get $up)))
          (else
            ;; own = sqrt(Σ (row − centre[a])²), columns in order
            (local.set $centre (i32.add (local.get $centres) (i32.mul (local.get $a) (local.get $rowBytes))))
            (local.set $own (f64.const 0))
            (local.set $u (i32.const 0))
            (loop $column
              (local.set $own (f64.add
                (f64.mul
                  (local.tee $diff (f64.sub
                    (f64.load (i32.add (local.get $rows) (local.get $u)))
                    (f64.load (i32.add (local.get $centre) (local.get $u)))))
                  (local.get $diff))
                (local.get $own)))
              (br_if $column
                (i32.lt_u (local.tee $u (i32.add (local.get $u) (i32.const 8))) (local.get $rowBytes))))
            (f64.store (local.get $upper) (local.tee $own (f64.sqrt (local.get $own))))
            (if (i32.eqz (f64.lt (local.get $own) (local.get $bound)))
              (then
                (i32.store (i32.add (local.get $list) (i32.shl (local.get $listed) (i32.const 2))) (local.get $row))
                (local.set $listed (i32.add (local.get $listed) (i32.const 1)))))))
        (local.set $assignment (i32.add (local.get $assignment) (i32.const 4)))
        (local.set $upper (i32.add (local.get $upper) (i32.const 8)))
        (local.set $lower (i32.add (local.get $lower) (i32.const 8)))
        (local.set $rows (i32.add (local.get $rows) (local.get $rowBytes)))
        (local.set $row (i32.add (local.get $row) (i32.const 1)))
        (br_if $next (local.tee $count (i32.sub (local.get $count) (i32.const 1))))))
    (local.get $listed)))
