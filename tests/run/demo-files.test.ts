/** The bundled demo scenario's files, found from wherever the code runs. */
import { existsSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { resolveBeamDataPath, resolveDemoFile, resolveServiceConfig } from '../../src/run/demo-files.js';

describe('the demo files', () => {
  it('`demo` names the bundled machine and service configuration; anything else is a path, unchanged', () => {
    expect(existsSync(resolveBeamDataPath('demo'))).toBe(true);
    expect(resolveBeamDataPath('demo')).toMatch(/fixtures[\\/]demo[\\/]beam-data[\\/]manifest\.json$/);
    expect(resolveBeamDataPath('clinic/linac1.json')).toBe('clinic/linac1.json');
    expect(existsSync(resolveServiceConfig('demo'))).toBe(true);
    expect(resolveServiceConfig('site.json')).toBe('site.json');
  });
  it('a file the demo lacks comes back as its relative path (the caller then says it is missing)', () => {
    expect(resolveDemoFile('no/such.csv')).toBe('fixtures/demo/no/such.csv');
    expect(existsSync(resolveDemoFile('ct/hu-to-density.csv'))).toBe(true);
  });
});
