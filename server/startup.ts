import fs from 'node:fs';
import path from 'node:path';

import { verifyPassword } from 'better-auth/crypto';

import type { Db } from '@/db';
import { demoAccounts, demoPassword } from '@/db/seed';

import { anyUserWithEmail, passwordHashesOf } from './store/sessions';

/**
 * The demo accounts that still sign in with the published demo password. A production
 * server must not start while any does: anyone who read the README could sign in.
 */
export async function demoAccountsWithPublishedPassword(db: Db): Promise<string[]> {
  const rows = passwordHashesOf(
    db,
    demoAccounts.map((a) => a.email),
  );
  const open: string[] = [];
  for (const row of rows) if (row.hash && (await verifyPassword({ hash: row.hash, password: demoPassword }))) open.push(row.email);
  return open;
}

/** Whether any demo account exists (the sign-ins are printed only then, and only in demo mode). */
export function hasDemoAccounts(db: Db): boolean {
  return anyUserWithEmail(
    db,
    demoAccounts.map((a) => a.email),
  );
}

/** Removes the `.part` files an upload leaves when the server is killed mid-request; returns how many. */
export function sweepPartialUploads(uploadsDir: string): number {
  if (!fs.existsSync(uploadsDir)) return 0;
  let removed = 0;
  for (const entry of fs.readdirSync(uploadsDir, { recursive: true, withFileTypes: true })) {
    if (entry.isFile() && entry.name.endsWith('.part')) {
      fs.rmSync(path.join(entry.parentPath, entry.name), { force: true });
      removed++;
    }
  }
  return removed;
}
