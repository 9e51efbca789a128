import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    globalSetup: ['tests/setup/reference-tools.ts'],
    // Beam-data validation is never served from a cache in tests (tests/run/validation-cache.test.ts tests the cache itself).
    env: { PLUMBLINE_CACHE_DIR: 'off' },
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
