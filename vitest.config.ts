import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/unit/**/*.test.ts', 'test/protocol/**/*.test.ts', 'test/cli/**/*.test.ts', 'test/export/**/*.test.ts', 'test/docs/**/*.test.ts', 'test/pack/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
