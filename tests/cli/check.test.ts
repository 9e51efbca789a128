import { spawnSync } from 'node:child_process';
import { copyFileSync, cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { unwrapped } from '../helpers/text.js';
import { CheckDocument } from '../../src/report/check-json.js';
import { runPython } from '../../scripts/lib/find-python.js';
import { writeVariant } from '../helpers/plan-variants.js';
import { isControl } from '../../src/model/index.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const CLINIC = join(ROOT, 'fixtures/demo/clinic');
const plumbline = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });

describe('plumbline check', () => {
  it('exit 0 when every beam of every plan is within tolerance', () => {
    const r = plumbline('check', join(CLINIC, 'spine-ssd.dcm'), join(CLINIC, 'brain-laterals.dcm'), '--beam-data', 'demo');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/summary: 2 plan\(s\), 3 beam\(s\) checked, 0 not checked; 2 within tolerance/);
    expect(r.stdout).toMatch(/deviation = \(independent − planning system\) \/ planning system/);
    expect(r.stdout).toMatch(/an aid to, never a replacement for/);
  });

  it('exit 1 for the demo clinic: a plan beyond the action level; the electron and VMAT plans checked', () => {
    const r = plumbline('check', CLINIC, '--beam-data', 'demo');
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/RT Plan "L BREAST TG".*BEYOND ACTION LEVEL/);
    expect(r.stdout).toMatch(/RT Plan "SCAR E9".*WITHIN TOLERANCE/);
    expect(r.stdout).toMatch(/RT Plan "PROST VMAT".*WITHIN TOLERANCE/);
    expect(r.stdout).toMatch(/modified Clarkson integration/);
  });

  it('--json: one document its schema accepts, with the SHA-256 of each plan as sha256sum computes it', () => {
    const r = plumbline('check', CLINIC, '--beam-data', 'demo', '--json');
    const doc = CheckDocument.parse(JSON.parse(r.stdout));
    expect(doc.plans).toHaveLength(7);
    const file = doc.plans[0]!.file;
    const reference = spawnSync('sha256sum', [file], { encoding: 'utf8' }).stdout.split(' ')[0]; // coreutils
    expect(doc.plans[0]!.fileSha256).toBe(reference);
    expect(doc.beamData.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(doc.beamData.invented).toBe(true);
  });

  it('--html writes one self-contained page with the caution, the chart and every hand calculation', () => {
    const out = join(mkdtempSync(join(tmpdir(), 'plumbline-html-')), 'report.html');
    const r = plumbline('check', CLINIC, '--beam-data', 'demo', '--html', out);
    expect(r.status).toBe(1);
    const html = readFileSync(out, 'utf8');
    expect(html).toMatch(/^<!doctype html>/);
    expect(html).not.toMatch(/(src|href)=["']?(https?:)?\/\//);
    expect(html).not.toMatch(/<(script|link)\b/);
    expect(html.match(/<svg /g)!.length).toBeGreaterThanOrEqual(5);
    expect(html.match(/dose per MU \(cGy\/MU\)/g)).toHaveLength(13);
    expect(html).toMatch(/an aid to, never a replacement for/);
    expect(html).toMatch(/@page \{ size: A4/);
  });

  it('goes on past a bad file in a batch, reports it, and exits 2', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-batch-'));
    copyFileSync(join(CLINIC, 'spine-ssd.dcm'), join(dir, 'good.dcm'));
    const samples = runPython('import pydicom, os; print(os.path.join(os.path.dirname(pydicom.__file__), "data", "test_files"))').trim();
    copyFileSync(join(samples, 'rtplan_truncated.dcm'), join(dir, 'truncated.dcm'));
    writeFileSync(join(dir, 'notes.txt'), 'not a plan');
    const r = plumbline('check', dir, '--beam-data', 'demo');
    expect(r.status).toBe(2);
    expect(r.stdout).toMatch(/RT Plan "SPINE PA".*WITHIN TOLERANCE/);
    expect(unwrapped(r.stdout)).toMatch(/1 file\(s\) refused/);
    expect(r.stderr).toMatch(/truncated\.dcm: the file .* ends before the data it declares/);
  });

  it('a plan whose energy the beam data lack is refused with exit 2, naming what is missing', () => {
    const r = plumbline('check', join(ROOT, 'fixtures/demo/plans/four-field-box.dcm'), '--beam-data', 'demo');
    expect(r.status).toBe(2);
    expect(unwrapped(r.stdout)).toMatch(/no 18 MV photon beam in its beam data; expected 6 MV, 10 MV, 15 MV/);
  });

  it('refuses bad options', () => {
    expect(plumbline('check', CLINIC, '--beam-data', 'demo', '--point', '1,2').stderr).toMatch(/--point must be x,y,z/);
    expect(plumbline('check', CLINIC, '--beam-data', 'demo', '--machine-alias', 'X').stderr).toMatch(/PLANNAME=DATANAME/);
  });
});

describe('strings from the plan reach the terminal shown, not obeyed', () => {
  it('a plan label with ESC, CR and BEL cannot hide the verdict', () => {
    const f = writeVariant('wedged-pair.dcm', (ds) => {
      ds.RTPlanLabel = 'X\u001b[2K\rOK: WITHIN\u0007';
    });
    const r = plumbline('check', f, '--beam-data', 'demo');
    expect([...(r.stdout + r.stderr)].filter((c) => isControl(c.charCodeAt(0), true))).toEqual([]);
    expect(r.stdout).toContain('X\ufffd[2K\ufffdOK: WITHIN\ufffd');
  });
});

describe('a folder: every file read, refused with its reason, or left aside with a line', () => {
  it('empty, 100-byte and mistyped-class .dcm files are refused; a FIFO and a note are skipped, said on stderr', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-folder-'));
    copyFileSync(join(CLINIC, 'brain-laterals.dcm'), join(dir, 'brain.dcm'));
    writeFileSync(join(dir, 'empty.dcm'), '');
    writeFileSync(join(dir, 'short.dcm'), readFileSync(join(CLINIC, 'spine-ssd.dcm')).subarray(0, 100));
    writeFileSync(join(dir, 'notes.txt'), 'chart rounds on Friday\n');
    spawnSync('mkfifo', [join(dir, 'pipe.dcm')]); // coreutils
    const mistyped = writeVariant('four-field-box.dcm', (ds) => {
      ds.SOPClassUID = '1.2.840.10008.5.1.4.1.1.481.55';
    });
    copyFileSync(mistyped, join(dir, 'mistyped.dcm'));
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', 'check', dir, '--beam-data', 'demo'], {
      cwd: ROOT,
      encoding: 'utf8',
      timeout: 20_000,
    });
    expect(r.status).toBe(2);
    for (const f of ['empty.dcm', 'short.dcm', 'mistyped.dcm']) expect(r.stderr).toMatch(new RegExp(`error: .*${f}`));
    expect(r.stderr).toMatch(/skipped 1 file\(s\), not a regular file \(a FIFO\), never opened: .*pipe\.dcm/);
    expect(r.stderr).toMatch(/skipped 1 file\(s\), not a DICOM file: .*notes\.txt/);
    expect(r.stdout).toMatch(/3 file\(s\) refused \(each on stderr\)/);
    // Each problem once: the report on stdout counts them, the lines are on stderr.
    expect(r.stdout).not.toMatch(/empty\.dcm/);
  });
});

describe('beam data that fail their validation are never used', () => {
  it('Sc scaled by 1.02 in the 6 MV table: check refuses (exit 2), naming the problem and `beams validate`', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-sc-'));
    cpSync(join(ROOT, 'fixtures/demo/beam-data'), dir, { recursive: true });
    const sc = join(dir, '6x/sc.csv');
    const scaled = readFileSync(sc, 'utf8').replace(/^(\d+(?:\.\d+)?),(\d\.\d+)$/gm, (_, f, v) => `${f},${(Number(v) * 1.02).toFixed(4)}`);
    writeFileSync(sc, scaled);
    const r = plumbline('check', join(CLINIC, 'brain-laterals.dcm'), '--beam-data', join(dir, 'manifest.json'));
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/6X: Sc of the reference field .* expected 1\.000 ± 0\.005, found 1\.0200/);
    expect(r.stderr).toMatch(/run `plumbline beams validate .*manifest\.json` for the full list/);
  });
});
