import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

import { schema } from '@/db';
import { createTestApp, makeJobBody, makeJobWithEngine, makeShop, memberWithRole, type Client, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** Inserts `n` jobs straight into the database; every third pair shares one updated_at, so the id must break ties. */
function seedJobs(shopId: string, n: number, label: string) {
  const base = Date.now() - 10 * 60_000;
  t.db.transaction((tx) => {
    for (let i = 0; i < n; i += 1) {
      const at = new Date(base + Math.floor(i / 2) * 1000);
      tx.insert(schema.jobs)
        .values({ id: crypto.randomUUID(), shopId, vehicle: `${label} van ${i}`, customerName: 'Paging Owner', createdAt: at, updatedAt: at })
        .run();
    }
  });
}

type Listed = { id: string; shopId: string; updatedAt: string };

async function walk(client: Client, path: string, key: 'jobs' | 'orders', limit: number, between?: () => Promise<void>) {
  const seen: Listed[] = [];
  let cursor: string | null = null;
  do {
    const sep = path.includes('?') ? '&' : '?';
    const res = await client.get(`${path}${sep}limit=${limit}${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`);
    expect(res.status).toBe(200);
    expect(res.body[key].length).toBeLessThanOrEqual(limit);
    seen.push(...res.body[key]);
    cursor = res.body.nextCursor;
    await between?.();
  } while (cursor);
  return seen;
}

describe('GET /api/jobs pages', { timeout: 60_000 }, () => {
  it('answers 50 jobs by default with a cursor, and at most 200 when asked', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Default page shop');
    seedJobs(shopId, 230, 'Default');
    const first = await founder.get('/api/jobs');
    expect(first.status).toBe(200);
    expect(first.body.jobs).toHaveLength(50);
    expect(typeof first.body.nextCursor).toBe('string');
    const most = await founder.get('/api/jobs?limit=200');
    expect(most.body.jobs).toHaveLength(200);
    const rest = await founder.get(`/api/jobs?limit=200&cursor=${most.body.nextCursor}`);
    expect(rest.body.jobs).toHaveLength(30);
    expect(rest.body.nextCursor).toBeNull();
  });

  it.each([['201'], ['0'], ['-1'], ['2.5'], ['many'], ['']])('answers 400 naming limit for limit=%s', async (limit) => {
    const { founder } = await makeShop(t, 'repair', 'Bad limit shop');
    const res = await founder.get(`/api/jobs?limit=${limit}`);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['limit']);
  });

  it.each([
    ['not base64', '!!!'],
    ['base64 of text', Buffer.from('hello').toString('base64url')],
    ['a wrong shape', Buffer.from(JSON.stringify({ at: 1, id: 'x' })).toString('base64url')],
    ['a negative time', Buffer.from(JSON.stringify([-5, 'x'])).toString('base64url')],
    ['too long', 'A'.repeat(500)],
  ])('answers 400 naming cursor for %s', async (_why, cursor) => {
    const { founder } = await makeShop(t, 'repair', 'Bad cursor shop');
    const res = await founder.get(`/api/jobs?cursor=${encodeURIComponent(cursor)}`);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['cursor']);
  });

  it('walks every job exactly once, newest change first, while new jobs arrive between pages, and never shows another shop', async () => {
    const mine = await makeShop(t, 'repair', 'Walk shop');
    const other = await makeShop(t, 'repair', 'Other walk shop');
    seedJobs(mine.shopId, 137, 'Walk');
    seedJobs(other.shopId, 40, 'Other');
    const before = t.db
      .select({ id: schema.jobs.id })
      .from(schema.jobs)
      .where(eq(schema.jobs.shopId, mine.shopId))
      .all()
      .map((j) => j.id);
    const added: string[] = [];
    const seen = await walk(mine.founder, '/api/jobs', 'jobs', 20, async () => {
      const res = await mine.founder.post('/api/jobs', makeJobBody({ vehicle: `Arrived mid-walk ${added.length}` }));
      added.push(res.body.job.id);
    });
    const ids = seen.map((j) => j.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of before) expect(ids).toContain(id);
    expect(seen.every((j) => j.shopId === mine.shopId)).toBe(true);
    // Newest change first: each page continues where the one before it stopped.
    const times = seen.map((j) => Date.parse(j.updatedAt));
    expect(times).toEqual([...times].sort((a, b) => b - a));
    // The other shop's cursor pages only the other shop.
    const otherSeen = await walk(other.founder, '/api/jobs', 'jobs', 15);
    expect(otherSeen).toHaveLength(40);
    expect(otherSeen.every((j) => j.shopId === other.shopId)).toBe(true);
  });

  it('reads a page through the shop index, ordered by it, in one query whatever the page size', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Plan shop');
    seedJobs(shopId, 60, 'Plan');
    const client = t.db.$client;
    // Every statement run, prepared now or earlier (hot lists keep theirs prepared), by its SQL.
    const statement = Object.getPrototypeOf(client.prepare('select 1')) as Record<'all' | 'get' | 'run', (...args: unknown[]) => unknown>;
    const record = () => {
      const ran: string[] = [];
      const spies = (['all', 'get', 'run'] as const).map((method) => {
        const original = statement[method];
        return vi.spyOn(statement, method).mockImplementation(function (this: { source: string }, ...args: unknown[]) {
          ran.push(this.source);
          return original.apply(this, args);
        });
      });
      return { ran, restore: () => spies.forEach((spy) => spy.mockRestore()) };
    };
    const listQuery = (ran: string[]) => ran.filter((q) => /from "jobs"/i.test(q) && /order by/i.test(q));
    let first: string | null = null;
    const firstPage = record();
    try {
      const page = await founder.get('/api/jobs?limit=5');
      first = page.body.nextCursor;
    } finally {
      firstPage.restore();
    }
    const listQueries = listQuery(firstPage.ran);
    expect(listQueries).toHaveLength(1);
    const plan = client
      .prepare(`explain query plan ${listQueries[0]}`)
      .all(...Array.from({ length: (listQueries[0]!.match(/\?/g) ?? []).length }, () => null))
      .map((r) => (r as { detail: string }).detail)
      .join('\n');
    expect(plan).toMatch(/USING INDEX jobs_shop_updated_id_idx/);
    expect(plan).not.toMatch(/TEMP B-TREE/);
    // A page of 60 takes as many statements as a page of 5: nothing runs per row.
    const small = record();
    try {
      await founder.get(`/api/jobs?limit=5&cursor=${first}`);
    } finally {
      small.restore();
    }
    const large = record();
    try {
      await founder.get('/api/jobs?limit=60');
    } finally {
      large.restore();
    }
    expect(listQuery(small.ran)).toHaveLength(1);
    // A later page starts its index range at the cursor (SQLite: "SEARCH … (shop_id=? AND (updated_at,id)<(?,?))"), so page 200 costs what page 1 does.
    const afterPlan = client
      .prepare(`explain query plan ${listQuery(small.ran)[0]}`)
      .all(...Array.from({ length: (listQuery(small.ran)[0]!.match(/\?/g) ?? []).length }, () => null))
      .map((r) => (r as { detail: string }).detail)
      .join('\n');
    expect(afterPlan).toMatch(/USING INDEX jobs_shop_updated_id_idx \(shop_id=\? AND \(updated_at,id\)<\(\?,\?\)\)/);
    expect(large.ran.length).toBe(small.ran.length);
  });
});

describe('POST /api/jobs cap', { timeout: 30_000 }, () => {
  it('answers 429 rate_limited past the per-shop cap, creates nothing, and leaves other shops alone', async () => {
    const capped = await createTestApp({ jobCreateRateLimit: { limit: 3, windowMs: 60_000 } });
    try {
      const a = await makeShop(capped, 'repair', 'Busy shop');
      const b = await makeShop(capped, 'repair', 'Quiet shop');
      for (let i = 0; i < 3; i += 1) expect((await a.founder.post('/api/jobs', makeJobBody())).status).toBe(201);
      const refused = await a.founder.post('/api/jobs', makeJobBody({ vehicle: 'One too many' }));
      expect(refused.status).toBe(429);
      expect(refused.body).toMatchObject({ error: { code: 'rate_limited', message: expect.stringMatching(/3 jobs in the last minute/) } });
      expect(capped.db.select().from(schema.jobs).where(eq(schema.jobs.vehicle, 'One too many')).all()).toEqual([]);
      expect((await b.founder.post('/api/jobs', makeJobBody())).status).toBe(201);
    } finally {
      await capped.close();
    }
  });

  it('defaults to 30 a minute', async () => {
    const plain = await createTestApp({ jobCreateRateLimit: undefined });
    try {
      const a = await makeShop(plain, 'repair', 'Default cap shop');
      const at = new Date(Date.now() - 5_000);
      plain.db.transaction((tx) => {
        for (let i = 0; i < 29; i += 1)
          tx.insert(schema.jobs)
            .values({ id: crypto.randomUUID(), shopId: a.shopId, vehicle: `Recent ${i}`, customerName: 'Cap Owner', createdAt: at, updatedAt: at })
            .run();
      });
      expect((await a.founder.post('/api/jobs', makeJobBody())).status).toBe(201);
      expect((await a.founder.post('/api/jobs', makeJobBody())).status).toBe(429);
    } finally {
      await plain.close();
    }
  });
});

describe('GET /api/incoming pages', { timeout: 60_000 }, () => {
  it('walks every order of the grinding shop once, 400 on a bad limit or cursor', async () => {
    const repair = await makeJobWithEngine(t, 'Incoming paging repair');
    const sheet = (await repair.founder.post(`/api/jobs/${repair.jobId}/sheets`, { title: 'Paged regrind', profileId: repair.profileId })).body.sheet;
    const grinding = await makeShop(t, 'grinding', 'Incoming paging grinding');
    const grinder = await memberWithRole(t, grinding.shopId, 'grinder');
    const issued = await repair.founder.post(`/api/sheets/${sheet.id}/issue`, { version: sheet.version, grinderShopId: grinding.shopId });
    expect(issued.status).toBe(201);
    const first = t.db.select().from(schema.grindOrders).where(eq(schema.grindOrders.id, issued.body.order.id)).get()!;
    const revision = t.db.select().from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, first.revisionId)).get()!;
    const sheetRow = t.db.select().from(schema.specSheets).where(eq(schema.specSheets.id, sheet.id)).get()!;
    t.db.transaction((tx) => {
      for (let i = 0; i < 11; i += 1) {
        // Each order on a sheet of its own: a later issued revision of one sheet would supersede the earlier orders.
        const sheetId = crypto.randomUUID();
        tx.insert(schema.specSheets)
          .values({ ...sheetRow, id: sheetId, profileId: null })
          .run();
        const revisionId = crypto.randomUUID();
        tx.insert(schema.sheetRevisions)
          .values({ ...revision, id: revisionId, sheetId, number: revision.number + i + 1 })
          .run();
        // Pairs share a creation time, so the id breaks ties.
        const at = new Date(first.createdAt.getTime() - 1000 * (1 + Math.floor(i / 2)));
        tx.insert(schema.grindOrders)
          .values({ ...first, id: crypto.randomUUID(), sheetId, revisionId, createdAt: at, updatedAt: at })
          .run();
      }
    });
    const seen = await walk(grinder, '/api/incoming', 'orders', 5);
    expect(seen).toHaveLength(12);
    expect(new Set(seen.map((o) => o.id)).size).toBe(12);
    expect((await grinder.get('/api/incoming')).body.nextCursor).toBeNull();
    const tooMany = await grinder.get('/api/incoming?limit=500');
    expect(tooMany.status).toBe(400);
    expect(Object.keys(tooMany.body.error.fields)).toEqual(['limit']);
    const bad = await grinder.get('/api/incoming?cursor=zz');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['cursor']);
  });
});

describe('GET /api/my/jobs pages', { timeout: 60_000 }, () => {
  it('lists each job once in the order of its newest open link, page by page, and only this shop', async () => {
    const { shopId } = await makeShop(t, 'repair', 'Owner paging shop');
    const customer = await memberWithRole(t, shopId, 'customer');
    const base = Date.now() - 60_000;
    const jobIds: string[] = [];
    t.db.transaction((tx) => {
      for (let i = 0; i < 7; i += 1) {
        const id = crypto.randomUUID();
        jobIds.push(id);
        tx.insert(schema.jobs)
          .values({ id, shopId, vehicle: `Owner car ${i}`, customerName: 'Paging Owner' })
          .run();
        // Two links per job: only the newer one orders it.
        for (const k of [0, 1]) {
          tx.insert(schema.shareLinks)
            .values({
              id: crypto.randomUUID(),
              shopId,
              jobId: id,
              tokenHash: crypto.randomUUID(),
              email: customer.email.toLowerCase(),
              expiresAt: new Date(Date.now() + 86_400_000),
              createdAt: new Date(base + i * 1000 + k),
            })
            .run();
        }
      }
    });
    const seen: { jobId: string; vehicle: string }[] = [];
    let cursor: string | null = null;
    do {
      const res = await customer.get(`/api/my/jobs?limit=3${cursor ? `&cursor=${cursor}` : ''}`);
      expect(res.status).toBe(200);
      seen.push(...res.body.jobs);
      cursor = res.body.nextCursor;
    } while (cursor);
    expect(seen.map((j) => j.jobId)).toEqual([...jobIds].reverse());
    expect(seen[0]!.vehicle).toBe('Owner car 6');
    const bad = await customer.get('/api/my/jobs?limit=0');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['limit']);
    expect((await customer.get('/api/my/jobs?cursor=%25%25')).status).toBe(400);
  });
});
