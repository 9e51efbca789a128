;; values[i] += k over 16-bit values in shared memory, eight at a time (SIMD), for the CT rescale.
;; Compiled by `npm run wasm` (scripts/make-wasm.ts, with wabt) into int16-add-module.ts.
;; add(from, to, k): every 16-byte block in [from, to) gets k added to each of its eight i16 lanes
;; (wrap-around; the caller makes sure no result leaves Int16). `to - from` is a multiple of 16.
(module
  (import "env" "mem" (memory 1 65536 shared))
  (func (export "add") (param $from i32) (param $to i32) (param $k i32)
    (local $v v128)
    (local.set $v (i16x8.splat (local.get $k)))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $from) (local.get $to)))
        (v128.store (local.get $from) (i16x8.add (v128.load (local.get $from)) (local.get $v)))
        (local.set $from (i32.add (local.get $from) (i32.const 16)))
        (br $next)))))
