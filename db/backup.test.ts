import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';

import Database from 'better-sqlite3';
import { afterAll, expect, it } from 'vitest';

import { builderWithShop, lostWrites, startJobWriters } from '@/tests/job-writers';
import { freePort, root, startServer, type ServerProcess } from '@/tests/server-process';

import { defaultBackupFile } from './backup';

const run = promisify(execFile);
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-backup-'));
const databasePath = path.join(dir, 'lobewright.sqlite');
const env = {
  DATABASE_PATH: databasePath,
  WEB_DIR: path.join(dir, 'no-web-export'),
  NODE_ENV: 'test' as const,
  AUTH_RATE_LIMIT: 'off',
  JOBS_PER_MINUTE: '100000',
};
let server: ServerProcess | undefined;

afterAll(async () => {
  await server?.stop('SIGKILL');
  fs.rmSync(dir, { recursive: true, force: true });
});

/** Runs a db script as `npm run db:*` does; resolves with its exit code and output. */
async function script(file: string, ...args: string[]) {
  try {
    const { stdout, stderr } = await run(path.join(root, 'node_modules', '.bin', 'tsx'), [file, ...args], { cwd: root, env: { ...process.env, ...env } });
    return { code: 0, output: stdout + stderr };
  } catch (error) {
    const failed = error as { code: number; stdout: string; stderr: string };
    return { code: failed.code, output: failed.stdout + failed.stderr };
  }
}

const savedJobs = (file: string) => {
  const db = new Database(file, { readonly: true });
  try {
    return db.prepare('select id, vehicle, findings, version from jobs').all() as { id: string; vehicle: string; findings: string; version: number }[];
  } finally {
    db.close();
  }
};

it('names default backups by UTC time under backups/', () => {
  expect(defaultBackupFile(new Date('2026-12-02T03:34:33.120Z'))).toBe(path.join('backups', 'lobewright-2026-12-02T03-34-33-120Z.sqlite'));
});

it('backs up the live database while the server writes, and restores it only once the server is stopped', async () => {
  server = await startServer(await freePort(), env);
  const builder = await builderWithShop(server.url, 'backup@example.test');
  const writers = startJobWriters(builder, 8);
  await writers.until(40);
  const before = [...writers.acked.values()];

  const backupFile = path.join(dir, 'backups', 'mid-write.sqlite');
  const backup = await script('db/backup.ts', backupFile);
  expect(backup.output).toContain('integrity ok');
  expect(backup.code).toBe(0);
  await writers.until(before.length + 20);
  writers.stop();
  await writers.done;

  // The copy is one file (no -wal beside it), passes integrity_check and holds every job acknowledged before it started.
  expect(fs.existsSync(`${backupFile}-wal`)).toBe(false);
  const copy = new Database(backupFile, { readonly: true });
  expect(copy.pragma('integrity_check', { simple: true })).toBe('ok');
  expect(copy.pragma('journal_mode', { simple: true })).toBe('delete');
  copy.close();
  const inBackup = savedJobs(backupFile);
  expect(lostWrites(before, inBackup)).toEqual([]);

  const refused = await script('db/restore.ts', backupFile);
  expect(refused.code).toBe(1);
  expect(refused.output).toContain('Stop the Lobewright server first');
  expect(savedJobs(databasePath).length).toBeGreaterThan(inBackup.length);

  await server.stop('SIGTERM');
  const restored = await script('db/restore.ts', backupFile);
  expect(restored.code, restored.output).toBe(0);
  expect(
    savedJobs(databasePath)
      .map((j) => j.id)
      .sort(),
  ).toEqual(inBackup.map((j) => j.id).sort());
  const kept = fs.readdirSync(dir).filter((f) => f.startsWith('lobewright.sqlite.replaced-'));
  expect(kept).toHaveLength(1);
  expect(savedJobs(path.join(dir, kept[0]!)).length).toBeGreaterThan(inBackup.length);
}, 60_000);
