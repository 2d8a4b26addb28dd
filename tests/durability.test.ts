import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import Database from 'better-sqlite3';
import { afterAll, expect, it } from 'vitest';

import { builderWithShop, lostWrites, startJobWriters } from './job-writers';
import { freePort, startServer, type ServerProcess } from './server-process';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-durability-'));
const databasePath = path.join(dir, 'lobewright.sqlite');
const running: ServerProcess[] = [];

afterAll(async () => {
  for (const server of running) await server.stop('SIGKILL');
  fs.rmSync(dir, { recursive: true, force: true });
});

it('keeps every acknowledged write when the server is killed mid-stream, and the file passes integrity_check', async () => {
  const port = await freePort();
  // Two workers on one file (WEB_CONCURRENCY=2): killing the process group takes both mid-write.
  const env = {
    DATABASE_PATH: databasePath,
    WEB_DIR: path.join(dir, 'no-web-export'),
    NODE_ENV: 'test',
    AUTH_RATE_LIMIT: 'off',
    JOBS_PER_MINUTE: '100000',
    WEB_CONCURRENCY: '2',
  };
  const first = await startServer(port, env);
  running.push(first);

  const builder = await builderWithShop(first.url, 'durable@example.test');
  const writers = startJobWriters(builder, 24);
  await writers.until(120);
  writers.stop();
  const unanswered = writers.inFlight();
  await first.stop('SIGKILL');
  await writers.done;
  expect(unanswered, 'writes in flight when the server was killed').toBeGreaterThan(0);
  // The process died with its work still in the write-ahead log: recovery has something to do.
  expect(fs.statSync(`${databasePath}-wal`).size).toBeGreaterThan(0);

  const second = await startServer(port, env);
  running.push(second);
  // Sessions live in the database, so the same cookie still signs the builder in.
  const saved: { id: string; vehicle: string; findings: string; version: number }[] = [];
  for (let cursor: string | null = null, first = true; first || cursor; first = false) {
    const page = await builder.get(`/api/jobs?limit=200${cursor ? `&cursor=${cursor}` : ''}`);
    expect(page.status).toBe(200);
    saved.push(...page.body.jobs);
    cursor = page.body.nextCursor;
  }
  expect(lostWrites(writers.acked.values(), saved)).toEqual([]);
  expect(saved.length).toBeGreaterThanOrEqual(writers.acked.size);
  await second.stop('SIGTERM');

  const db = new Database(databasePath, { readonly: true });
  try {
    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    expect(db.pragma('foreign_key_check')).toEqual([]);
    // Each saved job committed together with its audit row.
    const audited = db.prepare("select count(distinct entity_id) as n from audit_log where entity = 'job' and action = 'create'").get() as { n: number };
    expect(audited.n).toBe(saved.length);
  } finally {
    db.close();
  }
}, 60_000);
