import { defineConfig } from 'vitest/config';

/**
 * The quick loop (`npm run test:unit`): every test that needs neither the reference tools (dcmtk,
 * dicom3tools, pydicom), nor a browser, nor a PostgreSQL server, nor the built bundle. `npm test`
 * runs everything.
 */
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: [
      'tests/reference/**',
      'tests/cli/**',
      'tests/service/crash.test.ts',
      'tests/service/receiver.test.ts',
      'tests/service/web/server.test.ts',
      'tests/service/duplicates.test.ts',
      'tests/dicom/transfer-syntax.test.ts',
      'tests/dicom/dictionary.test.ts',
      'tests/service/history/postgres-store.test.ts',
      'tests/service/multi-node.test.ts',
      'tests/service/web-postgres.test.ts',
      'tests/service/received-hash.test.ts',
      'tests/run/dataset-hash.test.ts',
      'tests/dicom/object-summary.test.ts',
      'tests/service/history/postgres-migrations.test.ts',
    ],
    // Beam-data validation is never served from a cache in tests (tests/run/validation-cache.test.ts tests the cache itself).
    env: { PLUMBLINE_CACHE_DIR: 'off' },
    testTimeout: 60_000,
  },
});
