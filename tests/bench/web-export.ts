import { execSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

import { root } from '@/tests/server-process';

/** The web export the benchmarks serve: WEB_DIR or dist/, built first (npm run build) when it is missing. */
export function ensureWebExport(): string {
  const webDir = path.resolve(root, process.env.WEB_DIR || 'dist');
  if (!fs.existsSync(path.join(webDir, 'index.html')) || !fs.existsSync(path.join(root, 'dist-server', 'index.cjs'))) {
    console.log('No web export or server bundle yet: building them (npm run build)…');
    execSync('npm run build', { cwd: root, stdio: 'inherit' });
  }
  return webDir;
}
