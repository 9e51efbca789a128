import { readFileSync } from 'node:fs';
import wabtInit from 'wabt';

/**
 * The WebAssembly module a text-format (.wat) file describes, with the SIMD and threads features it
 * uses. (wabt's own validator ignores those features; the engine validates the module when it loads.)
 */
export async function compileWat(file: string): Promise<Uint8Array> {
  const wabt = await wabtInit();
  const module = wabt.parseWat(file, readFileSync(file, 'utf8'), { simd: true, threads: true });
  try {
    return new Uint8Array(module.toBinary({}).buffer);
  } finally {
    module.destroy();
  }
}
