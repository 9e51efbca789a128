/**
 * The reference tools the tests compare against. Missing tools fail the run at once with the
 * packages to install, rather than as a hundred confusing failures.
 */
import { spawnSync } from 'node:child_process';
import { findPythonWithPydicom } from '../../scripts/lib/find-python.js';
import { postgresBinDir } from '../helpers/postgres.js';

export default function setup(): void {
  const missing: string[] = [];
  const has = (cmd: string, args: string[]) => {
    const r = spawnSync(cmd, args, { encoding: 'utf8' });
    return !r.error;
  };
  if (!has('dcmdump', ['--version']) || !has('dcmconv', ['--version'])) missing.push('dcmtk');
  if (!has('dciodvfy', ['-help'])) missing.push('dicom3tools');
  if (!findPythonWithPydicom()) missing.push('python3-pydicom');
  if (!has('chromium', ['--version'])) missing.push('chromium');
  // The PostgreSQL history is tested on a server the tests start from Debian's programs.
  if (!postgresBinDir()) missing.push('postgresql');
  // Printed reports are read back as text by poppler.
  if (!has('pdftotext', ['-v'])) missing.push('poppler-utils');
  if (!has('openssl', ['version'])) missing.push('openssl');
  if (missing.length) {
    throw new Error(
      `the tests need Debian packages that are not installed: ${missing.join(' ')}\n` +
        `install them with: sudo apt-get install ${missing.join(' ')}   (.ci/run does this)`,
    );
  }
}
