/**
 * The password is read from standard input, never the command line: piped, its first line; at a
 * terminal (a real pseudo-terminal, opened by Python's pty module), asked twice without echo.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const SCRIPT = "import('./src/cli/password-prompt.ts').then(async (m) => console.log('READ:' + JSON.stringify(await m.readPassword())))";

describe('readPassword', () => {
  it('piped: the first line, without its line end', () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', '-e', SCRIPT], {
      cwd: ROOT,
      input: 'correct horse\r\nsecond line\n',
      encoding: 'utf8',
    });
    expect(r.stdout.trim()).toBe('READ:"correct horse"');
  });
  it('at a terminal: asked twice, nothing typed echoed; two different answers give none', () => {
    const atTerminal = (first: string, second: string) => {
      const py = `
import os, pty, sys, time, select
pid, fd = pty.fork()
if pid == 0:
    os.chdir(sys.argv[1]); os.execv(sys.argv[2], [sys.argv[2], '--import', 'tsx', '-e', sys.argv[3]])
out = b''
def read(seconds):
    global out
    end = time.time() + seconds
    while time.time() < end:
        r, _, _ = select.select([fd], [], [], 0.1)
        if r:
            try: out += os.read(fd, 4096)
            except OSError: return
def until(text):
    end = time.time() + 20
    while text.encode() not in out and time.time() < end: read(0.2)
until('password: ')
os.write(fd, (sys.argv[4] + '\\r').encode())
until('again: ')
os.write(fd, (sys.argv[5] + '\\r').encode())
until('READ:')
read(0.5)
sys.stdout.write(out.decode(errors='replace'))
`;
      return spawnSync('python3', ['-c', py, ROOT, process.execPath, SCRIPT, first, second], { encoding: 'utf8', timeout: 60_000 }).stdout;
    };
    const same = atTerminal('s3cret-typed', 's3cret-typed');
    expect(same).toContain('READ:"s3cret-typed"');
    // The only appearance of the password is the test's own print of what was read.
    expect(same.split('s3cret-typed')).toHaveLength(2);
    expect(atTerminal('one-password', 'another-one')).toContain('READ:undefined');
  }, 90_000);
});
