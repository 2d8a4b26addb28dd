import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';

import { afterAll, beforeAll, expect, it } from 'vitest';

import { defaultCalcRateLimit } from '@/server/routes/calc';
import { defaultAuthRateLimit } from '@/server/security';
import { makeEngineSpec, makeProfileSpec } from '@/tests/fixtures';

import { freePort, startServer, type ServerProcess } from './server-process';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-workers-'));
let server: ServerProcess;

beforeAll(async () => {
  const port = await freePort();
  // Sign-in limits on, as in production; two workers on one file.
  const env = { DATABASE_PATH: path.join(dir, 'lobewright.sqlite'), WEB_DIR: path.join(dir, 'no-web-export'), NODE_ENV: 'test', WEB_CONCURRENCY: '2' };
  server = await startServer(port, env, { timeoutMs: 60_000 });
}, 90_000);

afterAll(async () => {
  await server?.stop('SIGTERM');
  fs.rmSync(dir, { recursive: true, force: true });
});

/**
 * A POST on a connection of its own, closed after the answer. Node's cluster module hands
 * each new connection to the next worker in turn (round-robin, the default scheduling policy
 * everywhere but Windows: Node.js documentation, "Cluster: How it works"), so successive
 * calls alternate between the two workers.
 */
function postOnNewConnection(url: string, body: unknown, cookie?: string): Promise<{ status: number; cookies: string[] }> {
  return new Promise((resolve, reject) => {
    const target = new URL(url);
    const data = JSON.stringify(body);
    const req = http.request(
      {
        host: '127.0.0.1',
        port: target.port,
        path: target.pathname,
        method: 'POST',
        agent: false,
        headers: {
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(data),
          origin: target.origin,
          connection: 'close',
          ...(cookie ? { cookie } : {}),
        },
      },
      (res) => {
        res.resume();
        res.on('end', () => resolve({ status: res.statusCode ?? 0, cookies: res.headers['set-cookie'] ?? [] }));
      },
    );
    req.on('error', reject);
    req.end(data);
  });
}

it('names both workers in its start line once both listen', async () => {
  await expect.poll(() => server.output(), { timeout: 30_000 }).toMatch(/Server processes: 2 workers on one database file \(WEB_CONCURRENCY\), pids \d+, \d+/);
});

it('counts one address’s sign-in attempts across both workers, so splitting them over two processes gains a guesser nothing', async () => {
  const { max } = defaultAuthRateLimit.signIn;
  const statuses: number[] = [];
  for (let i = 0; i <= max; i++) {
    const res = await postOnNewConnection(`${server.url}/api/auth/sign-in/email`, { email: 'guess@example.test', password: `wrong-password-${i}` });
    statuses.push(res.status);
  }
  // Each worker saw about half the attempts: with a count per process none would reach the limit.
  expect(statuses.slice(0, max)).toEqual(Array.from({ length: max }, () => 401));
  expect(statuses[max]).toBe(429);
}, 60_000);

it('counts one person’s analyses across both workers against the one limit', async () => {
  const signUp = await postOnNewConnection(`${server.url}/api/auth/sign-up/email`, {
    name: 'Calc Person',
    email: 'calc@example.test',
    password: 'correct-horse-9',
  });
  expect(signUp.status).toBe(200);
  const cookie = signUp.cookies.map((c) => c.split(';')[0]).join('; ');
  const body = { engine: makeEngineSpec(), profiles: [makeProfileSpec()] };
  const { limit } = defaultCalcRateLimit;
  const statuses: number[] = [];
  for (let i = 0; i <= limit; i++) statuses.push((await postOnNewConnection(`${server.url}/api/calc/analyze`, body, cookie)).status);
  expect(statuses.slice(0, limit)).toEqual(Array.from({ length: limit }, () => 200));
  expect(statuses[limit]).toBe(429);
}, 60_000);
