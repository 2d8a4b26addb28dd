/**
 * Screen budgets:
 * - edit to paint: one keystroke on the compare screen re-parses the typed value, re-runs the analysis of
 *   the edited profile and of the baseline, and rebuilds the SVG paths (budget 16 ms, one frame at 60 Hz);
 * - first-load JS: every script Chromium fetches to show the sign-in page from the web export, gzipped
 *   (budget 440 KB). Route chunks for other screens, the plots and unit conversion load later and are not counted;
 * - the units chunk: calc/units.ts with the part of mathjs it uses, loaded when a unit is first converted
 *   (hooks/use-units.ts), gzipped (budget 80 KB).
 *   Builds dist/ first if missing (npm run build, which turns on the export's tree shaking).
 *
 * Run: npm run bench. Exits 1 when a budget is missed.
 */
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import zlib from 'node:zlib';

import { chromium } from 'playwright-core';

import { DEMO_ENGINE, DEMO_STOCK_REGRIND, DEMO_TOWING } from '@/calc/demo';
import { buildPlotPaths } from '@/lib/lift-plot-paths';
import { openDb } from '@/db';
import { createApp } from '@/server/app';
import { analyzeRecords } from '@/shared/analysis';
import { engineSchema } from '@/shared/engine';
import { profileSpecSchema } from '@/shared/profile';
import { draftFromText } from '@/lib/number-draft';
import { profileNumberSpecs } from '@/lib/profile-fields';
import { applyTryValues, tryDraftFrom } from '@/lib/try-values';
import { unitConverter } from '@/state/units';

import { ensureWebExport } from './web-export';

const FRAME_BUDGET_MS = 16;
const BUNDLE_BUDGET_KB = 440;
const UNITS_BUDGET_KB = 80;

const engine = engineSchema.parse({ ...DEMO_ENGINE, firingOrder: '1-8-4-3-6-5-7-2' });
const stock = profileSpecSchema.parse(DEMO_STOCK_REGRIND);
const towing = profileSpecSchema.parse(DEMO_TOWING);
const frame = { width: 760, height: 300, padding: { top: 16, right: 12, bottom: 36, left: 52 }, from: -270, to: 270 };

const inches = unitConverter(null, 'imperial', 'cc');
const towingDraft = tryDraftFrom(towing);

function editToPaths(keystroke: number): number {
  const t0 = performance.now();
  const typed = draftFromText(profileNumberSpecs.intake.duration050, String(206 + (keystroke % 20)), inches);
  const draft = applyTryValues(towing, { spec: { ...towingDraft.spec, intake: { ...towingDraft.spec.intake, duration050: typed } } }, inches);
  if (!draft.ok) throw new Error('bench draft rejected');
  const analyses = [analyzeRecords(engine, stock), analyzeRecords(engine, draft.spec)];
  const paths = buildPlotPaths(analyses, 'lift', frame);
  if (!paths.series[1]?.intake) throw new Error('no path');
  return performance.now() - t0;
}

for (let i = 0; i < 50; i++) editToPaths(i);
const times = Array.from({ length: 400 }, (_, i) => editToPaths(i)).sort((a, b) => a - b);
const p50 = times[Math.floor(times.length * 0.5)] ?? Infinity;
const p95 = times[Math.floor(times.length * 0.95)] ?? Infinity;
console.log(`edit to new plot paths: median ${p50.toFixed(2)} ms, p95 ${p95.toFixed(2)} ms (budget ${FRAME_BUDGET_MS} ms)`);

const webDir = ensureWebExport();

const gzippedKb = (file: string) => zlib.gzipSync(fs.readFileSync(file), { level: 9 }).length / 1024;

/** The chunk the export names after calc/units.ts (units-<hash>.js). */
function unitsChunkKb(): number {
  const dir = path.join(webDir, '_expo', 'static', 'js', 'web');
  const chunks = fs.readdirSync(dir).filter((name) => /^units-[0-9a-f]+\.js$/.test(name));
  if (chunks.length !== 1) throw new Error(`expected one units chunk in ${dir}, found ${chunks.length}`);
  return gzippedKb(path.join(dir, chunks[0]!));
}

/** Serves the export, opens /sign-in in Chromium, and adds up the gzipped size of every script it fetched. */
async function firstLoadKb(): Promise<number> {
  const app = createApp({ db: openDb(':memory:'), baseURL: 'http://127.0.0.1', secret: 'bench-secret-bench-secret-bench-secret', webDir });
  const server = await new Promise<ReturnType<typeof app.listen>>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'],
  });
  try {
    const page = await browser.newPage();
    const scripts = new Set<string>();
    page.on('response', (res) => {
      const url = new URL(res.url());
      if (url.pathname.endsWith('.js')) scripts.add(url.pathname);
    });
    await page.goto(`http://127.0.0.1:${(server.address() as AddressInfo).port}/sign-in`);
    await page.getByTestId('sign-in-email').waitFor();
    let bytes = 0;
    for (const script of scripts) bytes += gzippedKb(path.join(webDir, script));
    return bytes;
  } finally {
    await browser.close();
    server.close();
  }
}

const unitsKb = unitsChunkKb();
console.log(`units chunk gzipped: ${unitsKb.toFixed(1)} KB (budget ${UNITS_BUDGET_KB} KB; calc/units.ts and the mathjs it uses)`);

firstLoadKb().then((firstKb) => {
  console.log(`first-load JS gzipped: ${firstKb.toFixed(1)} KB (budget ${BUNDLE_BUDGET_KB} KB; scripts fetched to show the sign-in page)`);

  const missed = [p95 > FRAME_BUDGET_MS && 'edit to paint', firstKb > BUNDLE_BUDGET_KB && 'first-load JS', unitsKb > UNITS_BUDGET_KB && 'units chunk'].filter(
    Boolean,
  );
  if (missed.length) {
    console.error(`screen bench: OVER BUDGET (${missed.join(', ')})`);
    process.exit(1);
  }
});
