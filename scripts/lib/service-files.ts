import { writeFileSync } from 'node:fs';
import net from 'node:net';

/** A loopback port free at the moment of asking (the benches and tests start receivers on it). */
export function freePort(): Promise<number> {
  return new Promise<number>((done) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const p = (s.address() as net.AddressInfo).port;
      s.close(() => done(p));
    });
  });
}

/**
 * A service configuration written for a bench or a test: the format, the folders beside the file,
 * the demo beam data, and whatever the caller adds or overrides. Returns the file.
 */
export function writeServiceConfig(file: string, fields: Record<string, unknown>): string {
  writeFileSync(
    file,
    JSON.stringify({
      format: 'plumbline.service',
      formatVersion: 1,
      folders: { inbox: 'inbox', archive: 'archive', refused: 'refused' },
      beamData: ['demo'],
      ...fields,
    }),
  );
  return file;
}
