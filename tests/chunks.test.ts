/**
 * Which modules each screen's own chunk pulls in. The web export puts a module that two route chunks
 * share into the common chunk every first load carries (DEVELOPERS.md, "The web export splits by
 * route"), so calc's engine, the plots and the owner's page must be reached only through their one
 * import() each. This follows every route file's static imports (esbuild's metafile, the same module
 * resolution as the export: `.web` files first) and fails if any route reaches them another way.
 */
import fs from 'node:fs';
import path from 'node:path';

import { build } from 'esbuild';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '..');

function routeFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    return entry.isDirectory() ? routeFiles(full) : /\.tsx?$/.test(entry.name) ? [full] : [];
  });
}

/** The project files a route imports statically, directly or through others (import() is not followed). */
async function staticImports(file: string): Promise<string[]> {
  const result = await build({
    absWorkingDir: root,
    entryPoints: [file],
    bundle: true,
    write: false,
    metafile: true,
    packages: 'external',
    platform: 'browser',
    jsx: 'automatic',
    logLevel: 'silent',
    loader: { '.png': 'empty', '.ttf': 'empty' },
    resolveExtensions: ['.web.tsx', '.web.ts', '.tsx', '.ts', '.js'],
  });
  const inputs = result.metafile.inputs;
  const start = path.relative(root, file);
  const seen = new Set([start]);
  const queue = [start];
  for (let next = queue.shift(); next !== undefined; next = queue.shift()) {
    for (const imported of inputs[next]?.imports ?? []) {
      if (imported.external || imported.kind === 'dynamic-import' || seen.has(imported.path)) continue;
      seen.add(imported.path);
      queue.push(imported.path);
    }
  }
  return [...seen];
}

/** Modules that only the lazy chunks may hold. */
const LAZY_ONLY = [
  'calc/analysis.ts',
  'calc/measured.ts',
  'calc/lift-curve.ts',
  'calc/regrind.ts',
  'shared/analysis.ts',
  'shared/job-core.ts',
  'components/compare/lift-plot.tsx',
  'components/owner/owner-desk.tsx',
  'components/owner/owner-summary.tsx',
];

describe('route chunks', () => {
  it('reach calc, the plots and the owner page only through their one import() each', async () => {
    const routes = routeFiles(path.join(root, 'app'));
    expect(routes.length).toBeGreaterThan(20);
    const offenders: string[] = [];
    for (const route of routes) {
      const inputs = await staticImports(route);
      expect(inputs.length, route).toBeGreaterThan(0);
      for (const mod of LAZY_ONLY) if (inputs.includes(mod)) offenders.push(`${path.relative(root, route)} → ${mod}`);
    }
    expect(offenders).toEqual([]);
  }, 60_000);

  it('still finds a module a route imports directly', async () => {
    // The check above would pass vacuously if it could not see imports: the compare route does import its screen.
    const inputs = await staticImports(path.join(root, 'app/(app)/jobs/[id]/compare.tsx'));
    expect(inputs).toContain('components/compare/compare-screen.tsx');
    expect(inputs).toContain('components/ui/lazy-calc.tsx');
  });
});
