import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['src/**/*.spec.ts'],
    // The integration tests wait for messages on a real broker; this is only the give-up limit.
    testTimeout: 20_000,
  },
});
