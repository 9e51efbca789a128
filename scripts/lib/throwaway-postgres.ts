import { spawnSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';

/** A PostgreSQL server of the tests' and benches' own: a cluster in a temporary folder, on a Unix socket there, stopped and removed at the end. */
export interface ThrowawayPostgres {
  /** A connection URL for a new, empty database of this cluster. */
  readonly newDatabase: (name: string) => Promise<string>;
  readonly stop: () => void;
}

/** Debian puts the server's programs under /usr/lib/postgresql/<major>/bin, off the PATH. */
export function postgresBinDir(): string | undefined {
  const onPath = spawnSync('sh', ['-c', 'command -v initdb'], { encoding: 'utf8' }).stdout.trim();
  if (onPath) {
    const real = spawnSync('readlink', ['-f', onPath], { encoding: 'utf8' }).stdout.trim();
    return real.slice(0, real.lastIndexOf('/'));
  }
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return undefined;
  const majors = readdirSync(root).sort((a, b) => Number(b) - Number(a));
  return majors.map((m) => join(root, m, 'bin')).find((d) => existsSync(join(d, 'initdb')));
}

/** The server refuses to run as root: as root, the cluster belongs to nobody. */
const NOBODY = 65534;

/**
 * initdb into a temporary folder (as an unprivileged user when the tests run as root), the server
 * listening only on a Unix socket in that folder, trust authentication for its one superuser.
 */
export function startThrowawayPostgres(): ThrowawayPostgres {
  const bin = postgresBinDir();
  if (!bin) throw new Error("PostgreSQL's server is not installed (Debian package postgresql): .ci/run installs it");
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-pg-'));
  const asRoot = process.getuid?.() === 0;
  if (asRoot) chownSync(dir, NOBODY, NOBODY);
  const user = asRoot ? { uid: NOBODY, gid: NOBODY } : {};
  const run = (program: string, args: string[]) => {
    const r = spawnSync(join(bin, program), args, { ...user, encoding: 'utf8', cwd: dir });
    if (r.status !== 0) throw new Error(`${program} failed: ${r.stderr || r.stdout}`);
  };
  const data = join(dir, 'data');
  run('initdb', ['-D', data, '-U', 'plumbline', '--auth=trust', '-E', 'UTF8', '--no-sync', '--no-instructions']);
  run('pg_ctl', ['-D', data, '-l', join(dir, 'server.log'), '-w', '-o', `-k ${dir} -c listen_addresses= -p 5432 -c fsync=off`, 'start']);
  const base = { host: dir, port: 5432, user: 'plumbline' };
  return {
    newDatabase: async (name) => {
      const c = new pg.Client({ ...base, database: 'postgres' });
      await c.connect();
      try {
        await c.query(`CREATE DATABASE "${name}"`);
      } finally {
        await c.end();
      }
      return `postgresql://plumbline@/${name}?host=${encodeURIComponent(dir)}&port=5432`;
    },
    stop: () => {
      try {
        run('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
