/**
 * Beam-data validation remembered by the SHA-256 of every byte: the same data are not validated
 * twice, a change of any byte (or of plumbline) validates afresh, and only a pass is remembered.
 * The cache's use is shown by a mark planted in an entry (a warning no validation writes).
 */
import { appendFileSync, cpSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadBeamData } from '../../src/run/beam-data.js';
import { validationCacheDir } from '../../src/run/validation-cache.js';
import { DEMO_MANIFEST } from '../helpers/machines.js';

const MARK = 'planted by the test';
function setup() {
  const data = mkdtempSync(join(tmpdir(), 'plumbline-vc-data-'));
  cpSync(dirname(DEMO_MANIFEST), data, { recursive: true });
  return { manifest: join(data, 'manifest.json'), cache: mkdtempSync(join(tmpdir(), 'plumbline-vc-cache-')) };
}
/** Plants a warning in every entry of the cache. */
function plant(cache: string, edit: (e: Record<string, any>) => void = () => {}) {
  for (const f of readdirSync(cache)) {
    const e = JSON.parse(readFileSync(join(cache, f), 'utf8'));
    e.warnings.push({ severity: 'warning', code: 'physical-range', message: MARK });
    edit(e);
    writeFileSync(join(cache, f), JSON.stringify(e));
  }
}
const marked = (r: ReturnType<typeof loadBeamData>) => r.ok && (r.warnings ?? []).some((w) => w.message === MARK);

describe('the validation cache', () => {
  it('remembers a pass and serves it to the next load of the same bytes', () => {
    const { manifest, cache } = setup();
    expect(loadBeamData(manifest, cache).ok).toBe(true);
    expect(readdirSync(cache)).toHaveLength(1);
    plant(cache);
    expect(marked(loadBeamData(manifest, cache))).toBe(true);
  });
  it('validates afresh when any byte of a table changes', () => {
    const { manifest, cache } = setup();
    loadBeamData(manifest, cache);
    plant(cache);
    appendFileSync(join(dirname(manifest), '6x', 'sc.csv'), '# one more byte\n');
    const r = loadBeamData(manifest, cache);
    expect(r.ok).toBe(true);
    expect(marked(r)).toBe(false);
    expect(readdirSync(cache)).toHaveLength(2);
  });
  it('ignores an entry of another plumbline version', () => {
    const { manifest, cache } = setup();
    loadBeamData(manifest, cache);
    plant(cache, (e) => (e.tool = '0.0.0-other'));
    expect(marked(loadBeamData(manifest, cache))).toBe(false);
  });
  it('never remembers beam data that fail their validation', () => {
    const { manifest, cache } = setup();
    const sc = join(dirname(manifest), '6x', 'sc.csv');
    writeFileSync(sc, readFileSync(sc, 'utf8').replace(/^10,1\.0000$/m, '10,1.0200'));
    expect(loadBeamData(manifest, cache).ok).toBe(false);
    expect(readdirSync(cache)).toHaveLength(0);
  });
  it('lives in PLUMBLINE_CACHE_DIR, else under XDG_CACHE_HOME or ~/.cache; "off" turns it off', () => {
    expect(validationCacheDir({ PLUMBLINE_CACHE_DIR: '/x' })).toBe(join('/x', 'validated-beam-data'));
    expect(validationCacheDir({ XDG_CACHE_HOME: '/c' })).toBe(join('/c', 'plumbline', 'validated-beam-data'));
    expect(validationCacheDir({ PLUMBLINE_CACHE_DIR: 'off' })).toBeUndefined();
  });
});
