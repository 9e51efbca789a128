/** Passwords kept as scrypt hashes: our stored form checked by another implementation (Python's hashlib.scrypt). */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '../../../src/service/web/passwords.js';

describe('stored passwords', () => {
  it("are scrypt keys that Python's hashlib derives the same from the password and the stored salt and parameters", async () => {
    const stored = await hashPassword('correct horse battery staple');
    const [kind, n, r, p, salt, key] = stored.split('$');
    expect([kind, n, r, p]).toEqual(['scrypt', '16384', '8', '1']);
    const py = spawnSync(
      'python3',
      [
        '-c',
        'import base64, hashlib, sys; n, r, p, salt = sys.argv[1:5]; ' +
          'print(base64.b64encode(hashlib.scrypt(b"correct horse battery staple", salt=base64.b64decode(salt), n=int(n), r=int(r), p=int(p), ' +
          'maxmem=64 * 1024 * 1024, dklen=64)).decode())',
        n!,
        r!,
        p!,
        salt!,
      ],
      { encoding: 'utf8' },
    );
    expect(py.status, py.stderr).toBe(0);
    expect(py.stdout.trim()).toBe(key);
  });
  it('match only their password; a fresh salt each time; a form that cannot be read matches nothing', async () => {
    const a = await hashPassword('a long demo passphrase');
    expect(await verifyPassword('a long demo passphrase', a)).toBe(true);
    expect(await verifyPassword('a long demo passphrasE', a)).toBe(false);
    expect(await hashPassword('a long demo passphrase')).not.toBe(a);
    expect(await verifyPassword('x', 'plain text')).toBe(false);
    expect(a).not.toContain('a long demo passphrase');
  });
});
