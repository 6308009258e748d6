import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
    // expect.poll waits for what a page does in its own time (a key kept in storage, a build
    // shown); on a loaded machine that can take longer than vitest's 1 s default. A poll still
    // returns as soon as its condition holds.
    expect: { poll: { timeout: 20_000 } },
  },
});
