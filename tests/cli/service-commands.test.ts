/** The service commands from the command line: a configuration refused with the path of what is wrong; history as text and JSON. */
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { type AddressInfo, createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { writeServiceConfig } from '../../scripts/lib/service-files.js';
import { HistoryDocument } from '../../src/cli/service-commands.js';
import { SqliteHistoryStore } from '../../src/service/history/sqlite-store.js';
import { check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine, manifestPath } from '../helpers/machines.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8' });

describe('plumbline history and the service configuration', () => {
  it('refuses a configuration naming the attribute that is wrong (exit 2)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-cfg-'));
    const file = join(dir, 'bad.json');
    writeServiceConfig(file, {
      receiver: { allowedCallingAeTitles: ['THIS TITLE IS FAR TOO LONG'] },
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { database: 'h.sqlite' },
    });
    const r = run('history', '--config', file);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/receiver\.allowedCallingAeTitles\.0.*1 to 16 printable ASCII characters/);
  });

  it('lists the recorded checks, filtered by verdict, as text and as a versioned JSON document', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-hist-cli-'));
    const file = join(dir, 'service.json');
    writeServiceConfig(file, {
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { database: 'h.sqlite' },
    });
    const store = new SqliteHistoryStore(join(dir, 'h.sqlite'));
    for (const f of ['brain-laterals.dcm', 'breast-tangents.dcm']) {
      const result = check(importOrThrow(manifestPath(`fixtures/demo/clinic/${f}`)), machine(DEMO_MANIFEST));
      await store.recordCheck({ recordedAt: new Date().toISOString(), result, planSha256: f, toolVersion: 'test', inputs: [], html: '' });
    }
    await store.close();
    const text = run('history', '--config', file);
    expect(text.status).toBe(0);
    expect(text.stdout).toMatch(/2 check\(s\)/);
    expect(text.stdout).toMatch(/L BREAST TG .* beyond action level/);
    const doc = HistoryDocument.parse(JSON.parse(run('history', '--config', file, '--verdict', 'beyond action level', '--json').stdout));
    expect(doc.checks.map((c) => c.planLabel)).toEqual(['L BREAST TG']);
    expect(run('history', '--config', file, '--verdict', 'fine').stderr).toMatch(/--verdict must be/);
  });

  it("exports the chart-round list as CSV that Python's csv module reads back: one row per check, oldest first, with its review", async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-export-'));
    const file = join(dir, 'service.json');
    writeServiceConfig(file, {
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { kind: 'sqlite', file: 'h.sqlite' },
    });
    const store = new SqliteHistoryStore(join(dir, 'h.sqlite'));
    const ids: number[] = [];
    for (const [k, f] of ['brain-laterals.dcm', 'breast-tangents.dcm'].entries()) {
      const result = check(importOrThrow(manifestPath(`fixtures/demo/clinic/${f}`)), machine(DEMO_MANIFEST), { explain: true });
      ids.push(
        (await store.recordCheck({
          recordedAt: `2026-12-0${k + 1}T09:00:00.000Z`,
          result,
          planSha256: f,
          toolVersion: 'test',
          inputs: [],
          html: '',
        }))!,
      );
    }
    await store.addReview({
      checkId: ids[1]!,
      reviewer: 'Physicist, A. "Chart"',
      reviewedAt: '2026-12-03T08:00:00.000Z',
      accepted: false,
      comment: '',
    });
    await store.close();
    const out = join(dir, 'rounds.csv');
    const r = run('history', 'export', '--config', file, '--since', '2026-12-01', '--out', out);
    expect(r.status, r.stderr).toBe(0);
    // Read back by a CSV reader of another project (Python's standard library).
    const rows = JSON.parse(
      spawnSync('python3', ['-c', 'import csv, json, sys; print(json.dumps(list(csv.reader(open(sys.argv[1], newline="")))))', out], {
        encoding: 'utf8',
      }).stdout,
    ) as string[][];
    expect(rows[0]).toEqual(expect.arrayContaining(['check', 'verdict', 'worst_beam', 'worst_deviation_percent', 'likely_cause', 'last_reviewer']));
    const col = (name: string) => rows[0]!.indexOf(name);
    expect(rows.slice(1).map((row) => row[col('plan')])).toEqual(['BRAIN LATS', 'L BREAST TG']);
    const breast = rows[2]!;
    expect(breast[col('verdict')]).toBe('beyond action level');
    expect(breast[col('worst_beam')]).toBe('2');
    expect(Number(breast[col('worst_deviation_percent')])).toBeCloseTo(10.25, 1);
    expect(breast[col('likely_cause')]).toMatch(/^beam 2: MU as typed\? \+11\.\d %$/);
    expect(breast[col('last_reviewer')]).toBe('Physicist, A. "Chart"');
    expect(breast[col('last_review_accepted')]).toBe('no');
    expect(run('history', 'export', '--config', file).stderr).toMatch(/--since/);
  });
});

describe('a port already in use', () => {
  it('serve: a clear message naming the configuration, exit 2, not an internal error', async () => {
    const blocker = createServer();
    await new Promise<void>((done) => blocker.listen(0, '127.0.0.1', done));
    const port = (blocker.address() as AddressInfo).port;
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-port-'));
    const file = join(dir, 'service.json');
    writeServiceConfig(file, {
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { database: 'h.sqlite' },
      serve: { host: '127.0.0.1', port },
    });
    const r = await new Promise<{ status: number | null; stderr: string }>((done) => {
      const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', 'serve', '--config', file], { cwd: ROOT });
      let stderr = '';
      child.stderr.on('data', (d) => (stderr += d));
      child.on('close', (status) => done({ status, stderr }));
    });
    blocker.close();
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(new RegExp(`serve: 127\\.0\\.0\\.1:${port} is already in use.*choose another host or port`));
    expect(r.stderr).not.toMatch(/internal error|EADDRINUSE/);
  });

  it('--port and --host override the configuration for serve and receive; a port that is no number is refused', async () => {
    const blocker = createServer();
    await new Promise<void>((done) => blocker.listen(0, '127.0.0.1', done));
    const port = (blocker.address() as AddressInfo).port;
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-port-over-'));
    const file = join(dir, 'service.json');
    writeServiceConfig(file, {
      receiver: { host: '127.0.0.1', port: 1, aeTitle: 'PLUMBLINE', allowedCallingAeTitles: ['NG_TPS'] },
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { kind: 'sqlite', file: 'h.sqlite' },
      serve: { host: '127.0.0.1', port: 1 },
    });
    const started = (...args: string[]) =>
      new Promise<{ status: number | null; stderr: string }>((done) => {
        const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args, '--config', file], { cwd: ROOT });
        let stderr = '';
        child.stderr.on('data', (d) => (stderr += d));
        child.on('close', (status) => done({ status, stderr }));
      });
    // The configuration's port 1 would be refused for want of permission; the override's port is the one found busy.
    for (const command of ['serve', 'receive']) {
      const r = await started(command, '--port', String(port), '--host', '127.0.0.1');
      expect(r.status, r.stderr).toBe(2);
      expect(r.stderr).toMatch(new RegExp(`127\\.0\\.0\\.1:${port} is already in use`));
    }
    blocker.close();
    const bad = await started('serve', '--port', 'eighty');
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--port must be a port number/);
  });
});

describe('accounts of the page and where it may listen', () => {
  const configIn = (dir: string, serve: Record<string, unknown> = {}) => {
    const file = join(dir, 'service.json');
    writeServiceConfig(file, {
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { kind: 'sqlite', file: 'h.sqlite' },
      serve,
    });
    return file;
  };
  const withInput = (input: string, ...args: string[]) =>
    spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8', input });

  it('users add reads the password from standard input, keeps only its scrypt hash, refuses a short one and a second account of a name', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-users-'));
    const file = configIn(dir);
    const added = withInput('a long demo passphrase\n', 'users', 'add', 'Physicist A', '--role', 'physicist', '--config', file);
    expect(added.status, added.stderr).toBe(0);
    expect(added.stdout).toMatch(/account Physicist A \(physicist\) added/);
    expect(withInput('short\n', 'users', 'add', 'Viewer B', '--role', 'viewer', '--config', file).stderr).toMatch(/at least 12 characters/);
    expect(withInput('a long demo passphrase\n', 'users', 'add', 'Physicist A', '--role', 'viewer', '--config', file).stderr).toMatch(
      /exists already/,
    );
    expect(withInput('x\n', 'users', 'add', 'Physicist A', '--role', 'admin', '--config', file).stderr).toMatch(/--role must be physicist or viewer/);
    const store = new SqliteHistoryStore(join(dir, 'h.sqlite'));
    const u = (await store.user('Physicist A'))!;
    await store.close();
    expect(u.role).toBe('physicist');
    expect(u.passwordHash).toMatch(/^scrypt\$16384\$8\$1\$/);
    expect(u.passwordHash).not.toContain('passphrase');
    expect(run('users', 'list', '--config', file).stdout).toMatch(/^Physicist A\tphysicist\tsince \d{4}-\d{2}-\d{2}$/m);
  });

  it('serve refuses an address beyond loopback without TLS or --behind-proxy (exit 2), naming both', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-serve-net-'));
    const r = run('serve', '--config', configIn(dir, { host: '0.0.0.0', port: 8471 }));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/beyond this machine, without TLS: give serve\.tls \(certificate and key\) or --behind-proxy/);
  });

  it('serves over TLS with the configured certificate: the sign-in cookie says Secure', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-serve-tls-'));
    const made = spawnSync(
      'openssl',
      [
        'req',
        '-x509',
        '-newkey',
        'rsa:2048',
        '-nodes',
        '-keyout',
        join(dir, 'key.pem'),
        '-out',
        join(dir, 'cert.pem'),
        '-days',
        '1',
        '-subj',
        '/CN=127.0.0.1',
      ],
      { encoding: 'utf8' },
    );
    expect(made.status, made.stderr).toBe(0);
    const blocker = createServer();
    await new Promise<void>((done) => blocker.listen(0, '127.0.0.1', done));
    const port = (blocker.address() as AddressInfo).port;
    await new Promise<void>((done) => blocker.close(() => done()));
    const file = configIn(dir, { host: '127.0.0.1', port, tls: { cert: 'cert.pem', key: 'key.pem' } });
    expect(withInput('a long demo passphrase\n', 'users', 'add', 'Viewer B', '--role', 'viewer', '--config', file).status).toBe(0);
    const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', 'serve', '--config', file], { cwd: ROOT });
    let log = '';
    child.stderr.on('data', (d) => (log += d));
    try {
      const { waitFor } = await import('../helpers/wait-for.js');
      expect(await waitFor(() => log.includes(`https://127.0.0.1:${port}/`), 20_000)).toBe(true);
      const { request } = await import('node:https');
      const res = await new Promise<{ status: number; cookie: string }>((done, fail) => {
        const req = request(
          {
            host: '127.0.0.1',
            port,
            path: '/signin',
            method: 'POST',
            rejectUnauthorized: false,
            headers: { 'content-type': 'application/x-www-form-urlencoded' },
          },
          (r) => {
            r.resume();
            done({ status: r.statusCode ?? 0, cookie: String(r.headers['set-cookie'] ?? '') });
          },
        );
        req.on('error', fail);
        req.end('name=Viewer+B&password=a+long+demo+passphrase');
      });
      expect(res.status).toBe(303);
      expect(res.cookie).toMatch(/HttpOnly; SameSite=Strict; Path=\/; Max-Age=28800; Secure$/);
    } finally {
      child.kill('SIGTERM');
    }
  });
});
