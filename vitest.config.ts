import { resolve } from 'node:path';
import { defineConfig } from 'vitest/config';

const alias = { '@shared': resolve(__dirname, 'src-shared') };

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['test/**/*.test.ts'],
          exclude: ['test/e2e/**'],
          environment: 'node',
          testTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          include: ['test/e2e/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          // A locator read inside expect.poll waits for its element like Playwright does; 1 s (vitest's default) is too short for an IPC round trip on a loaded machine.
          expect: { poll: { timeout: 30_000 } },
        },
      },
    ],
  },
});
