import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

import BrowserTestOrder from './tests/e2e/sequencer';

// Browser tests: one real server started as the README starts it, driven by Debian's Chromium.
export default defineConfig({
  resolve: {
    alias: { '@': fileURLToPath(new URL('.', import.meta.url)) },
  },
  test: {
    include: ['tests/e2e/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/e2e/global-setup.ts'],
    fileParallelism: false,
    sequence: { sequencer: BrowserTestOrder },
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
