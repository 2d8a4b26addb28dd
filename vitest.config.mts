import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  resolve: {
    alias: { '@': fileURLToPath(new URL('.', import.meta.url)) },
  },
  test: {
    include: [
      'calc/**/*.test.ts',
      'server/**/*.test.ts',
      'shared/**/*.test.ts',
      'lib/**/*.test.ts',
      'constants/**/*.test.ts',
      'db/**/*.test.ts',
      'tests/*.test.ts',
      'tests/api/**/*.test.ts',
    ],
    environment: 'node',
    pool: 'forks',
    // API tests sign several people up (scrypt hashing): on a busy 2-core machine 5 s is too tight.
    testTimeout: 20_000,
  },
});
