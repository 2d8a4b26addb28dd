import { count, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';

import { createAuth } from '@/server/auth';

import { openDb, schema } from './index';
import { demoAccounts, demoJobId, seedDemo } from './seed';

describe('demo seed', () => {
  it('writes both shops, one person per role and the demo job, and adds nothing on a second run', async () => {
    const db = openDb(':memory:');
    const auth = createAuth({ db, baseURL: 'http://localhost:8080', secret: 'test-secret-test-secret-test-secret' });
    await seedDemo(db, auth);
    await seedDemo(db, auth);
    expect(db.select({ n: count() }).from(schema.shops).get()?.n).toBe(2);
    expect(db.select({ n: count() }).from(schema.users).get()?.n).toBe(demoAccounts.length);
    const roles = db.select({ role: schema.memberships.role }).from(schema.memberships).all().map((r) => r.role);
    expect(roles.sort()).toEqual(['builder', 'customer', 'grinder', 'tech']);
    const job = db.select().from(schema.jobs).where(eq(schema.jobs.id, demoJobId)).get();
    expect(job?.mileage).toBe(161000);
    expect(job?.vehicle).toMatch(/demo/);
  });
});
