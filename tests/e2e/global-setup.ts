import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import type { TestProject } from 'vitest/node';

import { freePort, waitForHealth } from '@/tests/server-process';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

/** Starts `npm start` (build, migrate, seed, serve) on a free port and a temporary database. */
export default async function setup(project: TestProject) {
  fs.mkdirSync(path.resolve(__dirname, 'artifacts'), { recursive: true });
  // While iterating on a screen, point the tests at a server you already run.
  if (process.env.E2E_BASE_URL) {
    project.provide('baseUrl', process.env.E2E_BASE_URL);
    return;
  }
  const port = await freePort();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-e2e-'));
  const baseUrl = `http://localhost:${port}`;
  let output = '';
  const child = spawn('npm', ['start'], {
    cwd: path.resolve(__dirname, '..', '..'),
    // The suite signs in far more often than one address may in production.
    env: { ...process.env, PORT: String(port), DATABASE_PATH: path.join(dir, 'e2e.sqlite'), NODE_ENV: 'test', AUTH_RATE_LIMIT: 'off' },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  child.stdout?.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr?.on('data', (d: Buffer) => (output += d.toString()));
  await waitForHealth(baseUrl, child, () => output.slice(-4000), 240_000);
  project.provide('baseUrl', baseUrl);

  return () => {
    if (child.pid && child.exitCode === null) process.kill(-child.pid, 'SIGTERM');
    fs.rmSync(dir, { recursive: true, force: true });
  };
}
