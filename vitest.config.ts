import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.{ts,tsx}'],
    environment: 'node',
    globalSetup: ['tests/setup/global-postgres.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
