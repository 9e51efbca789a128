/**
 * The CT volume's memory, and the rescale that dominates reading it: v + k over every 16-bit value.
 * The volume lives in a WebAssembly memory so the addition runs eight values at a time (SIMD
 * i16x8.add, a module of a few dozen bytes assembled below); JavaScript does the rest when the
 * engine lacks SIMD. Why: adding the intercept to 50 million voxels one by one took longer than
 * reading the files.
 */

// (func (param $from i32) (param $to i32) (param $k i32) (local $v v128)
//   $v = i16x8.splat($k); while ($from < $to) { store($from, i16x8.add(load($from), $v)); $from += 16 })
const CODE = [
  0x20,
  0x02,
  0xfd,
  0x10,
  0x21,
  0x03, // local.get k; i16x8.splat; local.set v
  0x02,
  0x40,
  0x03,
  0x40, // block; loop
  0x20,
  0x00,
  0x20,
  0x01,
  0x4f,
  0x0d,
  0x01, // br_if 1 (from >= to)
  0x20,
  0x00,
  0x20,
  0x00,
  0xfd,
  0x00,
  0x04,
  0x00,
  0x20,
  0x03,
  0xfd,
  0x8e,
  0x01,
  0xfd,
  0x0b,
  0x04,
  0x00, // store(from, load(from) + v)
  0x20,
  0x00,
  0x41,
  0x10,
  0x6a,
  0x21,
  0x00, // from += 16
  0x0c,
  0x00,
  0x0b,
  0x0b,
  0x0b, // br 0; end loop; end block; end
];
const BODY = [0x01, 0x01, 0x7b, ...CODE]; // one local of type v128
const MODULE = new Uint8Array([
  0x00,
  0x61,
  0x73,
  0x6d,
  0x01,
  0x00,
  0x00,
  0x00,
  0x01,
  0x07,
  0x01,
  0x60,
  0x03,
  0x7f,
  0x7f,
  0x7f,
  0x00, // type: (i32 i32 i32) -> ()
  0x02,
  0x0f,
  0x01,
  0x03,
  0x65,
  0x6e,
  0x76,
  0x03,
  0x6d,
  0x65,
  0x6d,
  0x02,
  0x03,
  0x01,
  0x80,
  0x80,
  0x04, // import env.mem (shared memory 1 .. 65536 pages)
  0x03,
  0x02,
  0x01,
  0x00, // function 0 of type 0
  0x07,
  0x07,
  0x01,
  0x03,
  0x61,
  0x64,
  0x64,
  0x00,
  0x00, // export "add"
  0x0a,
  BODY.length + 2,
  0x01,
  BODY.length,
  ...BODY, // code
]);

const PAGE_BYTES = 65536;
type Add = (fromByte: number, toByte: number, k: number) => void;
const added = new WeakMap<ArrayBufferLike, Add>();

/**
 * A zeroed Int16Array of n values; in shared WebAssembly memory when available, so `addInPlace` can
 * use SIMD and a second thread can read files into it (see parallel-read.ts).
 */
export function allocateInt16(n: number): Int16Array {
  if (typeof WebAssembly === 'undefined' || !WebAssembly.validate(MODULE)) return new Int16Array(n);
  const pages = Math.max(1, Math.ceil((2 * n) / PAGE_BYTES));
  let memory: WebAssembly.Memory;
  try {
    memory = new WebAssembly.Memory({ initial: pages, maximum: pages, shared: true });
  } catch {
    return new Int16Array(n); // beyond WebAssembly's 4 GiB, or refused: plain memory, read by one thread
  }
  const instance = new WebAssembly.Instance(new WebAssembly.Module(MODULE), { env: { mem: memory } });
  added.set(memory.buffer, instance.exports.add as Add);
  return new Int16Array(memory.buffer, 0, n);
}

/** values[i] += k for every value (16-bit wrap-around: the caller has made sure no result leaves Int16). */
export function addInPlace(values: Int16Array, k: number): void {
  const add = added.get(values.buffer);
  let from = 0;
  if (add && values.byteOffset % 16 === 0) {
    const whole = values.length - (values.length % 8);
    add(values.byteOffset, values.byteOffset + 2 * whole, k);
    from = whole;
  }
  for (let i = from; i < values.length; i++) values[i] = values[i]! + k;
}
