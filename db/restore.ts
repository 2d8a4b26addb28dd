/**
 * Puts a backup in place of the database. Refuses while any process (the
 * server) has the database open. The replaced file is kept beside it as
 * `<file>.replaced-<UTC time>`, and its -wal and -shm files are removed so
 * SQLite cannot replay the old log onto the restored file.
 *
 * Run: npm run db:restore -- <backup file>   (the server must be stopped)
 */
import fs from 'node:fs';

import Database from 'better-sqlite3';

import { readConfig } from '@/server/config';

import { checkDatabaseFile, fileTime } from './backup';

/**
 * True when another connection has `file` open. Every connection to a WAL
 * database holds a shared lock for as long as it is open, so an exclusive
 * lock taken without waiting fails exactly when someone else is connected.
 */
export function databaseInUse(file: string): boolean {
  if (!fs.existsSync(file)) return false;
  const db = new Database(file, { fileMustExist: true });
  try {
    db.pragma('busy_timeout = 0');
    db.pragma('locking_mode = EXCLUSIVE');
    db.exec('BEGIN EXCLUSIVE');
    db.exec('COMMIT');
    return false;
  } catch (error) {
    if ((error as { code?: unknown }).code === 'SQLITE_BUSY') return true;
    throw error;
  } finally {
    db.close();
  }
}

export function restoreDatabase(backup: string, target: string, now: Date = new Date()): { jobs: number; replaced: string | null } {
  const { jobs } = checkDatabaseFile(backup);
  if (databaseInUse(target)) {
    throw new Error(`${target} is open in another process. Stop the Lobewright server first, then restore again.`);
  }
  let replaced: string | null = null;
  if (fs.existsSync(target)) {
    replaced = `${target}.replaced-${fileTime(now)}`;
    fs.renameSync(target, replaced);
  }
  for (const extra of ['-wal', '-shm', '-journal']) fs.rmSync(`${target}${extra}`, { force: true });
  fs.copyFileSync(backup, target);
  return { jobs, replaced };
}

if (require.main === module) {
  const { databasePath } = readConfig();
  const backup = process.argv[2];
  if (!backup) {
    console.error('Name the backup to restore: npm run db:restore -- backups/lobewright-<time>.sqlite');
    process.exit(1);
  }
  try {
    const { jobs, replaced } = restoreDatabase(backup, databasePath);
    console.log(`Restored ${backup} to ${databasePath} (${jobs} jobs).`);
    if (replaced) console.log(`The database it replaced is kept as ${replaced}.`);
  } catch (error) {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  }
}
