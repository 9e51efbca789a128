import { spawnSync } from 'node:child_process';

/**
 * The Python that has pydicom (Debian's python3-pydicom). A pyenv or venv python3 earlier on PATH
 * often lacks it, so the system interpreter is tried as well. PLUMBLINE_PYTHON overrides.
 */
export function findPythonWithPydicom(): string | undefined {
  const candidates = [process.env.PLUMBLINE_PYTHON, 'python3', '/usr/bin/python3'].filter((c): c is string => !!c);
  for (const exe of candidates) {
    const r = spawnSync(exe, ['-c', 'import pydicom'], { encoding: 'utf8' });
    if (r.status === 0) return exe;
  }
  return undefined;
}

/** Runs a Python snippet with pydicom and returns its stdout; throws with stderr on failure. */
export function runPython(code: string, args: readonly string[] = []): string {
  const exe = findPythonWithPydicom();
  if (!exe) throw new Error('no python3 with pydicom found (install Debian python3-pydicom)');
  const r = spawnSync(exe, ['-c', code, ...args], { encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`python failed: ${r.stderr}`);
  return r.stdout;
}
