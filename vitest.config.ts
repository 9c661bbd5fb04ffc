import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.{ts,tsx}'],
    environment: 'node',
    globalSetup: ['tests/setup/global-postgres.ts'],
    setupFiles: ['tests/setup/timeouts.ts'],
    // expect.poll waits this long before failing (e2e steps on a loaded 2-core machine).
    expect: { poll: { timeout: 20_000, interval: 100 } },
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
