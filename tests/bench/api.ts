/**
 * Server budgets, measured on the real server (`node dist-server/index.cjs`, as `npm run serve` starts it) with
 * NODE_ENV=production, the web export and a freshly seeded temporary database:
 * - cold start: from spawning the process to the first healthy `/api/health`, median of three starts
 *   (budget 3 s);
 * - a spec sheet with its analysis (`GET /api/sheets/demo-sheet-flatbed-towing`, signed in as the demo
 *   builder: session, membership, sheet, revisions and their stored results) against the bare JSON route
 *   `/api/health` in the same server, each under autocannon with 50 connections: the sheet route's
 *   throughput as a share of the bare route's (budget 0.5) and its p99 latency (budget 25 ms).
 * Builds dist/ first if missing.
 *
 * Run: npm run bench. Exits 1 when a budget is missed.
 */
import { execFileSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import autocannon from 'autocannon';

import { demoAccounts, demoPassword, demoSheetId } from '@/db/seed';
import { Client } from '@/tests/fixtures';
import { freePort, root, startServer } from '@/tests/server-process';

import { ensureWebExport } from './web-export';

const COLD_START_BUDGET_MS = 3000;
const RATIO_BUDGET = 0.5;
const P99_BUDGET_MS = 25;
const CONNECTIONS = 50;
const SECONDS = 8;

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-bench-api-'));
const env = {
  NODE_ENV: 'production' as const,
  BETTER_AUTH_SECRET: crypto.randomBytes(32).toString('hex'),
  DATABASE_PATH: path.join(dir, 'bench.sqlite'),
  WEB_DIR: ensureWebExport(),
};

/** Requests per second and latency of one route under load; any non-2xx answer or error fails the bench. */
async function load(url: string, headers: Record<string, string> = {}) {
  await autocannon({ url, connections: CONNECTIONS, duration: 1, headers });
  const r = await autocannon({ url, connections: CONNECTIONS, duration: SECONDS, headers });
  if (r.non2xx || r.errors || r.timeouts) throw new Error(`${url}: ${r.non2xx} non-2xx, ${r.errors} errors, ${r.timeouts} timeouts`);
  return { rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99 };
}

async function main() {
  console.log(`api bench on ${os.cpus().length} cores, load average ${os.loadavg()[0]!.toFixed(1)} (other work on the machine slows every figure below)`);
  execFileSync(path.join(root, 'node_modules', '.bin', 'tsx'), ['db/seed.ts'], { cwd: root, env: { ...process.env, ...env }, stdio: 'ignore' });
  const port = await freePort();

  const starts: number[] = [];
  for (let i = 0; i < 3; i++) {
    const server = await startServer(port, env, { bundled: true });
    starts.push(server.startMs);
    await server.stop('SIGTERM');
  }
  const coldStart = [...starts].sort((a, b) => a - b)[1] ?? Infinity;
  console.log(
    `cold start to healthy /api/health: median ${(coldStart / 1000).toFixed(2)} s (${starts.map((s) => (s / 1000).toFixed(2)).join(', ')} s; budget ${COLD_START_BUDGET_MS / 1000} s, with the web export)`,
  );

  const server = await startServer(port, env, { bundled: true });
  try {
    const builder = new Client(server.url);
    const signIn = await builder.post('/api/auth/sign-in/email', { email: demoAccounts[0]!.email, password: demoPassword });
    if (signIn.status !== 200) throw new Error(`demo builder sign-in failed: ${signIn.status}`);
    const sheetPath = `/api/sheets/${demoSheetId}`;
    const sheet = await builder.get(sheetPath);
    if (sheet.status !== 200 || !sheet.body.sheet.current.results) throw new Error(`sheet route answered ${sheet.status} without results`);
    const cookie = builder.cookieHeader();

    const bare = await load(`${server.url}/api/health`);
    const sheetLoad = await load(`${server.url}${sheetPath}`, { cookie });
    const ratio = sheetLoad.rps / bare.rps;
    console.log(`bare JSON route /api/health: ${Math.round(bare.rps)} req/s, p50 ${bare.p50} ms, p99 ${bare.p99} ms (${CONNECTIONS} connections, ${SECONDS} s)`);
    console.log(`sheet with analysis ${sheetPath}: ${Math.round(sheetLoad.rps)} req/s, p50 ${sheetLoad.p50} ms, p99 ${sheetLoad.p99} ms`);
    console.log(`sheet/bare throughput ratio: ${ratio.toFixed(2)} (budget ≥ ${RATIO_BUDGET}); sheet p99 ${sheetLoad.p99} ms (budget ≤ ${P99_BUDGET_MS} ms)`);

    const missed = [
      coldStart > COLD_START_BUDGET_MS && 'cold start',
      ratio < RATIO_BUDGET && 'sheet/bare ratio',
      sheetLoad.p99 > P99_BUDGET_MS && 'sheet p99',
    ].filter(Boolean);
    if (missed.length) {
      console.error(`api bench: OVER BUDGET (${missed.join(', ')})`);
      process.exitCode = 1;
    }
  } finally {
    await server.stop('SIGTERM');
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
