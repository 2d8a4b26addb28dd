/**
 * Server budgets, measured on the real server (`node dist-server/index.cjs`, as `npm run serve` starts it) with
 * NODE_ENV=production, the web export and a freshly seeded temporary database:
 * - cold start: from spawning the process to the first healthy `/api/health`, median of three starts
 *   (budget 3 s);
 * - a spec sheet with its analysis (`GET /api/sheets/demo-sheet-flatbed-towing`, signed in as the demo
 *   builder: session, membership, sheet, revisions and their stored results) against the bare JSON route
 *   `/api/health` in the same server, each under autocannon with 50 connections: the sheet route's
 *   throughput as a share of the bare route's (budget 0.5) and its p99 latency (budget 25 ms).
 * - paging: with 10,000 jobs in the demo builder's shop, `GET /api/jobs` (its first page) at 20 connections
 *   has p99 ≤ 50 ms, while `/api/health`, called alongside, keeps its p99 within 3× its unloaded figure
 *   (1 connection, nothing else running; at least 1 ms, autocannon's resolution).
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
import Database from 'better-sqlite3';

import { demoAccounts, demoPassword, demoSheetId } from '@/db/seed';
import { Client } from '@/tests/fixtures';
import { freePort, root, startServer } from '@/tests/server-process';

import { ensureWebExport } from './web-export';

const COLD_START_BUDGET_MS = 3000;
const RATIO_BUDGET = 0.5;
const P99_BUDGET_MS = 25;
const CONNECTIONS = 50;
const SECONDS = 8;
const JOBS = 10_000;
const JOBS_CONNECTIONS = 20;
const JOBS_P99_BUDGET_MS = 50;
const HEALTH_SLOWDOWN_BUDGET = 3;

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-bench-api-'));
/** Demo mode (production mode seeds nothing and refuses the demo accounts), with deposits off as in production. */
const env = {
  NODE_ENV: 'development' as const,
  PAYMENTS: 'off',
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

/** Latency of one route at `connections`, failing on any non-2xx answer, error or timeout. */
async function latency(url: string, connections: number, headers: Record<string, string> = {}) {
  const r = await autocannon({ url, connections, duration: SECONDS, headers });
  if (r.non2xx || r.errors || r.timeouts) throw new Error(`${url}: ${r.non2xx} non-2xx, ${r.errors} errors, ${r.timeouts} timeouts`);
  return { rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99 };
}

/** Writes `count` jobs into the demo builder's shop in one transaction, straight into the database file. */
function seedJobs(databasePath: string, count: number) {
  const db = new Database(databasePath);
  try {
    const shop = db
      .prepare(
        `select m.shop_id as id from memberships m join users u on u.id = m.user_id join shops s on s.id = m.shop_id where u.email = ? and s.kind = 'repair' limit 1`,
      )
      .get(demoAccounts[0]!.email) as { id: string } | undefined;
    if (!shop) throw new Error('the demo builder has no shop');
    const insert = db.prepare('insert into jobs (id, shop_id, vehicle, customer_name, complaint, created_at, updated_at) values (?, ?, ?, ?, ?, ?, ?)');
    const start = Date.now() - count * 1000;
    db.transaction(() => {
      for (let i = 0; i < count; i++) {
        const at = start + i * 1000;
        insert.run(crypto.randomUUID(), shop.id, `Bench van ${i}`, `Bench owner ${i}`, 'Ticks at idle, loses power above 3000 rpm', at, at);
      }
    })();
  } finally {
    db.close();
  }
}

async function main() {
  console.log(`api bench on ${os.cpus().length} cores, load average ${os.loadavg()[0]!.toFixed(1)} (other work on the machine slows every figure below)`);
  execFileSync(path.join(root, 'node_modules', '.bin', 'tsx'), ['db/seed.ts'], { cwd: root, env: { ...process.env, ...env }, stdio: 'ignore' });
  seedJobs(env.DATABASE_PATH, JOBS);
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
    console.log(
      `bare JSON route /api/health: ${Math.round(bare.rps)} req/s, p50 ${bare.p50} ms, p99 ${bare.p99} ms (${CONNECTIONS} connections, ${SECONDS} s)`,
    );
    console.log(`sheet with analysis ${sheetPath}: ${Math.round(sheetLoad.rps)} req/s, p50 ${sheetLoad.p50} ms, p99 ${sheetLoad.p99} ms`);
    console.log(`sheet/bare throughput ratio: ${ratio.toFixed(2)} (budget ≥ ${RATIO_BUDGET}); sheet p99 ${sheetLoad.p99} ms (budget ≤ ${P99_BUDGET_MS} ms)`);

    const healthUrl = `${server.url}/api/health`;
    const unloaded = await latency(healthUrl, 1);
    const jobsUrl = `${server.url}/api/jobs`;
    const firstPage = await builder.get('/api/jobs');
    if (firstPage.status !== 200 || firstPage.body.jobs.length !== 50 || !firstPage.body.nextCursor)
      throw new Error(`jobs list answered ${firstPage.status} without a first page of 50`);
    await autocannon({ url: jobsUrl, connections: JOBS_CONNECTIONS, duration: 1, headers: { cookie } });
    const [jobsLoad, loadedHealth] = await Promise.all([latency(jobsUrl, JOBS_CONNECTIONS, { cookie }), latency(healthUrl, 1)]);
    const healthBudget = HEALTH_SLOWDOWN_BUDGET * Math.max(1, unloaded.p99);
    console.log(`/api/health alone: p50 ${unloaded.p50} ms, p99 ${unloaded.p99} ms (1 connection)`);
    console.log(
      `GET /api/jobs, ${JOBS} jobs in the shop, first page: ${Math.round(jobsLoad.rps)} req/s, p50 ${jobsLoad.p50} ms, p99 ${jobsLoad.p99} ms (${JOBS_CONNECTIONS} connections; budget ≤ ${JOBS_P99_BUDGET_MS} ms)`,
    );
    console.log(
      `/api/health meanwhile: p50 ${loadedHealth.p50} ms, p99 ${loadedHealth.p99} ms (budget ≤ ${healthBudget} ms, ${HEALTH_SLOWDOWN_BUDGET}× alone)`,
    );

    const missed = [
      coldStart > COLD_START_BUDGET_MS && 'cold start',
      ratio < RATIO_BUDGET && 'sheet/bare ratio',
      sheetLoad.p99 > P99_BUDGET_MS && 'sheet p99',
      jobsLoad.p99 > JOBS_P99_BUDGET_MS && 'jobs list p99',
      loadedHealth.p99 > healthBudget && 'health p99 under the jobs load',
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
