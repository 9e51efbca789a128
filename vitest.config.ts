import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    globalSetup: ['tests/setup/reference-tools.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
