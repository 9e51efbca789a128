/**
 * The CT rescale's WebAssembly module is built from its text (src/dicom/int16-add.wat) by wabt; the
 * module the code loads must be exactly what that text compiles to, and add k lane by lane.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { compileWat } from '../../scripts/lib/compile-wat.js';
import { INT16_ADD_WASM_BASE64 } from '../../src/dicom/int16-add-module.js';
import { addInPlace, allocateInt16 } from '../../src/dicom/int16-volume.js';

const WAT = fileURLToPath(new URL('../../src/dicom/int16-add.wat', import.meta.url));

describe('the rescale module', () => {
  it('is what its text compiles to (run npm run wasm after editing the .wat)', async () => {
    expect(Buffer.from(await compileWat(WAT)).toString('base64')).toBe(INT16_ADD_WASM_BASE64);
    expect(readFileSync(WAT, 'utf8')).toMatch(/i16x8\.add/);
  });
  it('adds k to every value with 16-bit wrap-around, the tail past the last eight included', () => {
    // Integer arithmetic on Int16 (common practice, no source): the result is the value + k modulo 2^16.
    const n = 8 * 1000 + 5;
    const v = allocateInt16(n);
    for (let i = 0; i < n; i++) v[i] = ((i * 7919) % 65536) - 32768;
    const expected = Int16Array.from(v, (x) => x - 1024);
    addInPlace(v, -1024);
    expect(Array.from(v)).toEqual(Array.from(expected));
  });
});
