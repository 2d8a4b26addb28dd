import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import Database from 'better-sqlite3';
import { eq } from 'drizzle-orm';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { openDb, schema, type Db } from './index';

// Two connections on one WAL file stand for two worker processes sharing it.
// SQLite's documented behaviour (https://www.sqlite.org/lang_transaction.html and
// https://www.sqlite.org/rescode.html#busy_snapshot): a read transaction that tries to become a write
// transaction after another connection committed fails with SQLITE_BUSY_SNAPSHOT; BEGIN IMMEDIATE takes
// the write lock first, so the other writer waits or is refused before it starts.
describe('write transactions on a file shared by several processes', () => {
  let dir: string;
  let file: string;
  let db: Db;
  let other: Database.Database;

  beforeEach(() => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-tx-'));
    file = path.join(dir, 'shared.sqlite');
    db = openDb(file);
    db.$client.prepare(`insert into outbox (id, "to", subject, text, html, created_at) values ('m1', 'a@b.example', 'one', 't', 'h', 0)`).run();
    other = new Database(file);
    other.pragma('busy_timeout = 0');
  });

  afterEach(() => {
    other.close();
    db.$client.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  const subjectOf = () => db.select({ subject: schema.outbox.subject }).from(schema.outbox).where(eq(schema.outbox.id, 'm1')).get()?.subject;

  it('shows why: a deferred read-then-write fails with SQLITE_BUSY_SNAPSHOT when another connection committed in between', () => {
    const deferred = () =>
      db.transaction(
        (tx) => {
          tx.select().from(schema.outbox).all();
          other.prepare(`update outbox set subject = 'other' where id = 'm1'`).run();
          tx.update(schema.outbox).set({ subject: 'mine' }).where(eq(schema.outbox.id, 'm1')).run();
        },
        { behavior: 'deferred' },
      );
    expect(deferred).toThrow(expect.objectContaining({ code: 'SQLITE_BUSY_SNAPSHOT' }));
    expect(subjectOf()).toBe('other');
  });

  it('begins every transaction immediate: the other writer is held off and this one commits', () => {
    let refused: unknown = null;
    db.transaction((tx) => {
      tx.select().from(schema.outbox).all();
      try {
        other.prepare(`update outbox set subject = 'other' where id = 'm1'`).run();
      } catch (error) {
        refused = error;
      }
      tx.update(schema.outbox).set({ subject: 'mine' }).where(eq(schema.outbox.id, 'm1')).run();
    });
    expect(refused).toEqual(expect.objectContaining({ code: 'SQLITE_BUSY' }));
    expect(subjectOf()).toBe('mine');
    // Once the lock is free the other connection writes normally.
    other.prepare(`update outbox set subject = 'other' where id = 'm1'`).run();
    expect(subjectOf()).toBe('other');
  });
});
