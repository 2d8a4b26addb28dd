import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';

import { openDb, schema } from './index';

describe('sheet revision triggers', () => {
  it('refuses to update or delete an issued revision, and allows both on a draft', () => {
    const db = openDb(':memory:');
    db.insert(schema.shops).values({ id: 's', name: 'Shop', slug: 's', kind: 'repair' }).run();
    db.insert(schema.jobs).values({ id: 'j', shopId: 's', vehicle: 'v', customerName: 'c' }).run();
    db.insert(schema.specSheets).values({ id: 'sh', shopId: 's', jobId: 'j', title: 't' }).run();
    const base = { sheetId: 'sh', label: 'x', spec: {} as never, engine: {} as never, results: {} as never };
    db.insert(schema.sheetRevisions)
      .values({ ...base, id: 'r1', number: 1, state: 'issued' })
      .run();
    db.insert(schema.sheetRevisions)
      .values({ ...base, id: 'r2', number: 2, state: 'draft' })
      .run();

    expect(() => db.update(schema.sheetRevisions).set({ note: 'changed' }).where(eq(schema.sheetRevisions.id, 'r1')).run()).toThrow(
      /issued revisions are immutable/,
    );
    expect(() => db.delete(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, 'r1')).run()).toThrow(/immutable/);
    db.update(schema.sheetRevisions).set({ note: 'changed' }).where(eq(schema.sheetRevisions.id, 'r2')).run();
    expect(db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, 'r2')).get()?.note).toBe('changed');
    expect(db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, 'r1')).get()?.note).toBe('');
  });
});
