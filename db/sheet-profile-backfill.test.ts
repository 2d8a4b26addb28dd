import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { afterAll, describe, expect, it } from 'vitest';

import * as schema from './schema';

const migrationsFolder = path.resolve(__dirname, '..', 'drizzle');
const scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-backfill-'));
afterAll(() => fs.rmSync(scratch, { recursive: true, force: true }));

/** A copy of drizzle/ that stops before the migration tagged `before` (so a database can be left as an older release had it). */
function migrationsBefore(before: string) {
  const folder = path.join(scratch, before);
  fs.cpSync(migrationsFolder, folder, { recursive: true });
  const journalFile = path.join(folder, 'meta', '_journal.json');
  const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8')) as { entries: { tag: string }[] };
  const stop = journal.entries.findIndex((e) => e.tag === before);
  expect(stop).toBeGreaterThan(0);
  journal.entries = journal.entries.slice(0, stop);
  fs.writeFileSync(journalFile, JSON.stringify(journal));
  return folder;
}

describe('binding existing sheets to their profiles (migrations 0009 to 0011)', () => {
  it('binds each sheet to the profile its create audit row names, else the profile its first revision is labelled with, one sheet per profile', () => {
    const client = new Database(':memory:');
    client.pragma('foreign_keys = ON');
    const db = drizzle({ client, schema });
    migrate(db, { migrationsFolder: migrationsBefore('0009_sheet_profile_core_notes') });

    const run = (sql: string, ...args: unknown[]) => client.prepare(sql).run(...args);
    run(`insert into shops (id, name, slug, kind) values ('s', 'Test shop', 's', 'repair')`);
    run(`insert into jobs (id, shop_id, vehicle, customer_name) values ('j', 's', 'Test truck', 'Test Owner'), ('k', 's', 'Test van', 'Test Owner')`);
    const profile = (id: string, job: string | null, label: string, at: number) =>
      run(`insert into cam_profiles (id, shop_id, job_id, label, spec, created_at) values (?, 's', ?, ?, '{}', ?)`, id, job, label, at);
    profile('stock', 'j', 'Stock', 1);
    profile('towing', 'j', 'Towing', 2);
    profile('towing-renamed', 'j', 'Towing', 3);
    profile('library', null, 'Economy', 1);
    profile('van-stock', 'k', 'Stock', 1);
    const sheet = (id: string, job: string, label: string, at: number) => {
      run(`insert into spec_sheets (id, shop_id, job_id, title, created_at) values (?, 's', ?, ?, ?)`, id, job, `Sheet ${id}`, at);
      run(`insert into sheet_revisions (id, sheet_id, number, label, spec, engine, results) values (?, ?, 1, ?, '{}', '{}', '{}')`, `${id}-1`, id, label);
    };
    // Started from the towing profile (the audit row says so) though its revision carries the stock label.
    sheet('audited', 'j', 'Stock', 10);
    run(`insert into audit_log (shop_id, action, entity, entity_id, detail) values ('s', 'create', 'sheet', 'audited', '{"profileId":"towing"}')`);
    // No audit row: matched by label to the oldest such profile of its own job.
    sheet('by-label', 'j', 'Stock', 11);
    // A second sheet matching the stock profile: the older one keeps it.
    sheet('second-stock', 'j', 'Stock', 12);
    // A label no profile of the job carries (only the library, which is no option).
    sheet('unmatched', 'j', 'Economy', 13);
    sheet('van', 'k', 'Stock', 14);

    migrate(db, { migrationsFolder });
    const bound = Object.fromEntries(
      (client.prepare('select id, profile_id from spec_sheets order by id').all() as { id: string; profile_id: string | null }[]).map((r) => [
        r.id,
        r.profile_id,
      ]),
    );
    expect(bound).toEqual({ audited: 'towing', 'by-label': 'stock', 'second-stock': null, unmatched: null, van: 'van-stock' });
    // The unique index holds: a second sheet for one profile of a job is refused.
    expect(() => run(`update spec_sheets set profile_id = 'stock' where id = 'second-stock'`)).toThrow(/UNIQUE/);
    // Revisions written before core notes travelled have none, so their checksums stay as they were.
    expect(client.prepare('select distinct core_notes from sheet_revisions').all()).toEqual([{ core_notes: '' }]);
    // Removing a profile (only ever with its job) leaves no sheet pointing at nothing.
    const fk = (client.pragma('foreign_key_list(spec_sheets)') as { table: string; on_delete: string }[]).find((k) => k.table === 'cam_profiles');
    expect(fk?.on_delete).toBe('SET NULL');
    client.close();
  });
});
