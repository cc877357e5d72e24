;; The k-means++ take step (takeCandidate in seeding.ts) without branches: centre `centre` has
;; become the chosen trial; each row's nearest distance becomes the smaller of its own and the
;; trial's, the larger one tightens the lower bound on the other centres, and the running total
;; of the nearest distances is written row by row and returned. The same comparisons and the same
;; additions in the same order as the JavaScript loop, so the numbers are bit for bit the same.
;;
;; All pointers are byte offsets of the block's first row; `stored` already points at the chosen
;; trial's column of the stored distances (rows `storedStride` bytes apart).
(module
  (import "env" "memory" (memory 0 65536))
  (func (export "take")
    (param $closest i32) (param $nearest i32) (param $secondLower i32) (param $cumulative i32)
    (param $stored i32) (param $count i32) (param $storedStride i32) (param $centre i32)
    (result f64)
    (local $win i32)
    (local $own f64) (local $trial f64) (local $low f64) (local $high f64) (local $running f64) (local $old f64)
    (local.set $running (f64.const 0))
    (block $done
      (br_if $done (i32.eqz (local.get $count)))
      (loop $row
        (local.set $own (f64.load (local.get $closest)))
        (local.set $trial (f64.load (local.get $stored)))
        (local.set $win (f64.lt (local.get $trial) (local.get $own)))
        ;; closest = win ? trial : own
        (f64.store (local.get $closest)
          (local.tee $low (select (local.get $trial) (local.get $own) (local.get $win))))
        ;; nearest = win ? centre : nearest
        (i32.store (local.get $nearest)
          (select (local.get $centre) (i32.load (local.get $nearest)) (local.get $win)))
        ;; secondLower = min(secondLower, high), high = win ? own : trial
        (local.set $high (select (local.get $own) (local.get $trial) (local.get $win)))
        (f64.store (local.get $secondLower)
          (select
            (local.get $high)
            (local.tee $old (f64.load (local.get $secondLower)))
            (f64.lt (local.get $high) (local.get $old))))
        ;; cumulative = running += low
        (f64.store (local.get $cumulative)
          (local.tee $running (f64.add (local.get $running) (local.get $low))))
        (local.set $closest (i32.add (local.get $closest) (i32.const 8)))
        (local.set $nearest (i32.add (local.get $nearest) (i32.const 4)))
        (local.set $secondLower (i32.add (local.get $secondLower) (i32.const 8)))
        (local.set $cumulative (i32.add (local.get $cumulative) (i32.const 8)))
        (local.set $stored (i32.add (local.get $stored) (local.get $storedStride)))
        (br_if $row (local.tee $count (i32.sub (local.get $count) (i32.const 1))))))
    (local.get $running)))
