/**
 * The CT volume's memory, and the rescale that dominates reading it: v + k over every 16-bit value.
 * The volume lives in a WebAssembly memory so the addition runs eight values at a time (SIMD
 * i16x8.add, compiled from int16-add.wat by `npm run wasm`); JavaScript does the rest when the
 * engine lacks SIMD. Why: adding the intercept to 50 million voxels one by one took longer than
 * reading the files.
 */
import { INT16_ADD_WASM_BASE64 } from './int16-add-module.js';

const MODULE = new Uint8Array(Buffer.from(INT16_ADD_WASM_BASE64, 'base64'));

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
