import fs from 'node:fs';
import path from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { apiMiddleware, appRoutes, fillPath, matrix, notCalled, type MatrixRow } from './matrix';
import { isApiPath, type ApiRoute } from './routes';
import { schema } from '@/db';

import {
  actors,
  buildWorld,
  internalTexts,
  isolated,
  paymentEvent,
  shopAMembers,
  shopAReaders,
  signWebhook,
  type Actor,
  type Marker,
  type World,
} from './world';

/** The app's own route table: every API route it registers, with the development tools on. */
const table = appRoutes();
const apiRoutes = table.api;

describe('the route table', () => {
  it('is read from the app itself, nested routers included', () => {
    const keys = apiRoutes.map((r) => r.key);
    expect(keys).toContain('GET /api/health');
    expect(keys).toContain('PATCH /api/jobs/:id');
    expect(keys).toContain('POST /api/orders/:id/move');
    expect(table.all.map((r) => r.key)).toContain('POST /api/auth/{*splat}');
  });

  it.each(apiRoutes.map((r) => [r.key]))('%s has a row in tests/api/matrix.ts', (key) => {
    expect(matrix[key], `No authorization matrix row for ${key}: add one to tests/api/matrix.ts (see DEVELOPERS.md)`).toBeDefined();
  });

  it('has no row for a route the app does not have', () => {
    const known = new Set(apiRoutes.map((r) => r.key));
    expect(Object.keys(matrix).filter((key) => !known.has(key))).toEqual([]);
  });

  it('lists every plain middleware under /api, so nothing answers requests outside a route', () => {
    const unknown = table.middleware
      .filter((m) => isApiPath(m.path) && !notCalled(`${m.path}/`))
      .filter((m) => !apiMiddleware.some((known) => known.path === m.path && known.name === m.name))
      .map((m) => `${m.name} at ${m.path}`);
    expect(unknown, 'Make it a route with a matrix row, or list it in apiMiddleware in tests/api/matrix.ts').toEqual([]);
  });

  it('leaves the development mailbox out in production', () => {
    const production = appRoutes(false);
    expect(production.all.filter((r) => r.path.startsWith('/api/dev/'))).toEqual([]);
  });
});

type Call = { route: string; who: Actor; status: number; expected: 'allow' | 'deny' };

let w: World;
const calls: Call[] = [];
const leaks: string[] = [];
const refusals: string[] = [];

beforeAll(async () => {
  w = await buildWorld();
}, 60_000);
afterAll(() => w?.t.close());

/** Calls `route` as `who` from the world's baseline; returns the leaks (a deny that got through, changed state or showed A's records) and wrong refusals. */
async function tryRoute(route: ApiRoute, row: MatrixRow, who: Actor): Promise<{ leaks: string[]; refusals: string[] }> {
  const query = row.query?.(w);
  const url = `${fillPath(route.path, row.params?.(w) ?? {})}${query ? `?${query}` : ''}`;
  const allowed = row.allow.includes(who);
  return isolated(w, async (probe) => {
    const body = row.body?.(w, who);
    const res = await w.as[who].request(route.method, url, body ?? (route.method === 'GET' || route.method === 'DELETE' ? undefined : {}));
    calls.push({ route: route.key, who, status: res.status, expected: allowed ? 'allow' : 'deny' });
    const text = typeof res.body === 'string' ? res.body : JSON.stringify(res.body);
    const seen = w.markers.filter((m) => text.includes(m.text));
    const problems: string[] = [];
    if (res.status >= 500) problems.push('a server error');
    if (!allowed) {
      const refusal = row.refusedAs ? [row.refusedAs.status] : who === 'anonymous' ? [401] : [401, 403, 404];
      if (!refusal.includes(res.status)) problems.push(`expected ${refusal.join(', ')}`);
      if (probe.dbChanged()) problems.push('changed the database');
      const files = probe.filesChanged();
      if (files.length) problems.push(`changed files ${files.join(', ')}`);
    }
    const unseen = !allowed
      ? seen
      : row.showsEveryone
        ? []
        : row.ownerPage
          ? seen.filter((m) => !ownerPageShows(m, who))
          : seen.filter((m) => !m.readers.includes(who));
    if (unseen.length) problems.push(`showed ${unseen.map((m) => m.what).join(', ')}`);
    if (allowed && !row.ownerPage && !row.changesShopA && !insidersOfA.includes(who) && probe.shopAChanged()) problems.push("changed shop A's records");
    const said = `${route.key} as ${who} answered ${res.status}`;
    const passed = (res.status >= 200 && res.status < 300) || res.status === 409;
    return {
      leaks: problems.length ? [`${said}: ${problems.join('; ')}`] : [],
      refusals: allowed && !passed ? [`${said}: ${text.slice(0, 300)}`] : [],
    };
  });
}

/**
 * What the owner's page may show `who`: what is on the page, and the owner's own records
 * (their job ids). Shop A's staff opening it are link holders like anyone: nothing internal.
 */
const ownerPageShows = (m: Marker, who: Actor) => m.onOwnerPage === true || (!shopAReaders.includes(who) && m.readers.includes(who));

/** People whose allowed calls may change shop A's rows: its members, and the grinder its order went to. */
const insidersOfA: Actor[] = [...shopAMembers, 'G1.grinder'];

describe('the isolation each call runs in', () => {
  it("sees a change to the database, to shop A's rows and to the files, and undoes all of them", async () => {
    const photo = Object.keys(Object.fromEntries(w.baseline.files))[0]!;
    await isolated(w, async (probe) => {
      w.t.db.$client.prepare('update shop_settings set version = version + 1 where shop_id = ?').run(w.a.shopId);
      expect(probe.dbChanged()).toBe(true);
      expect(probe.shopAChanged()).toBe(true);
      fs.rmSync(path.join(w.t.uploadsDir, photo));
      expect(probe.filesChanged()).toEqual([photo]);
    });
    await isolated(w, async (probe) => {
      w.t.db.$client.prepare("update users set name = 'Test Renamed' where id = (select user_id from memberships where shop_id = ?)").run(w.b.shopId);
      expect(probe.dbChanged()).toBe(true);
      expect(probe.shopAChanged()).toBe(false);
      expect(probe.filesChanged()).toEqual([]);
    });
    await isolated(w, async (probe) => {
      expect(probe.dbChanged()).toBe(false);
      expect(probe.filesChanged()).toEqual([]);
    });
  });
});

describe('authorization matrix', { timeout: 60_000 }, () => {
  it.each(apiRoutes.filter((r) => matrix[r.key]).map((r) => [r.key, r] as const))('%s', async (_key, route) => {
    const row = matrix[route.key]!;
    const found: string[] = [];
    for (const who of actors) {
      const result = await tryRoute(route, row, who);
      leaks.push(...result.leaks);
      refusals.push(...result.refusals);
      found.push(...result.leaks, ...result.refusals);
    }
    expect(found).toEqual([]);
  });

  it('called every route as every actor with no leaks, and left the baseline as it was', async () => {
    const routes = new Set(calls.map((c) => c.route));
    expect(routes.size).toBe(apiRoutes.length);
    expect(calls).toHaveLength(apiRoutes.length * actors.length);
    expect(calls.filter((c) => c.expected === 'deny').length).toBeGreaterThan(calls.length / 2);
    expect({ leaks, refusals }).toEqual({ leaks: [], refusals: [] });
    await isolated(w, async (probe) => {
      expect(probe.dbChanged()).toBe(false);
      expect(probe.filesChanged()).toEqual([]);
    });
    console.info(`authorization matrix: ${routes.size} routes × ${actors.length} actors = ${calls.length} calls, ${leaks.length} leaks`);
  });
});

describe("the owner's page and the payment webhook", { timeout: 60_000 }, () => {
  const ownerPageRoutes = () => apiRoutes.filter((r) => matrix[r.key]?.ownerPage);
  const paymentOf = (sessionId: string) =>
    w.t.db
      .select()
      .from(schema.payments)
      .all()
      .find((p) => p.checkoutSessionId === sessionId);

  it('answers a wrong share token with 404 for everyone and changes nothing', async () => {
    const wrong = (w.a.shareToken[0] === 'A' ? 'B' : 'A') + w.a.shareToken.slice(1);
    const shareRoutes = apiRoutes.filter((r) => r.path.startsWith('/api/share/:token'));
    expect(shareRoutes).toHaveLength(5);
    for (const route of shareRoutes) {
      const row = matrix[route.key]!;
      const url = fillPath(route.path, { ...row.params?.(w), token: wrong });
      for (const who of actors) {
        await isolated(w, async (probe) => {
          const res = await w.as[who].request(route.method, url, row.body?.(w, who) ?? (route.method === 'GET' ? undefined : {}));
          expect(res.status, `${route.key} as ${who}`).toBe(404);
          expect(probe.dbChanged(), `${route.key} as ${who}`).toBe(false);
        });
      }
    }
  });

  it("shows none of shop A's internal texts on any owner's page answer", async () => {
    const routes = ownerPageRoutes();
    expect(routes.length).toBe(11);
    for (const route of routes) {
      const row = matrix[route.key]!;
      for (const who of ['anonymous', 'A.builder', 'A.customer'] as const) {
        if (!row.allow.includes(who)) continue;
        await isolated(w, async () => {
          const res = await w.as[who].request(
            route.method,
            fillPath(route.path, row.params?.(w) ?? {}),
            row.body?.(w, who) ?? (route.method === 'GET' ? undefined : {}),
          );
          expect(res.status, `${route.key} as ${who}`).toBeLessThan(300);
          const text = typeof res.body === 'string' ? res.body : JSON.stringify(res.body);
          expect(
            internalTexts.filter((t) => text.includes(t)),
            `${route.key} as ${who}`,
          ).toEqual([]);
        });
      }
    }
  });

  it('takes a signed event for the open deposit, once, as whoever delivers it', async () => {
    const payload = JSON.stringify(paymentEvent(w.a.paidSessionId));
    expect(paymentOf(w.a.paidSessionId)?.state).toBe('open');
    await isolated(w, async (probe) => {
      const forged = await w.as['B.builder'].request('POST', '/api/payments/webhook', payload, {
        'stripe-signature': signWebhook(payload, 'whsec_test_someone_else'),
      });
      expect(forged.status).toBe(400);
      expect(probe.dbChanged()).toBe(false);
      const res = await w.as.anonymous.request('POST', '/api/payments/webhook', payload, {
        'stripe-signature': signWebhook(payload, w.t.payments.webhookSecret),
      });
      expect(res).toEqual({ status: 200, body: { received: true, duplicate: false } });
      expect(paymentOf(w.a.paidSessionId)).toMatchObject({ state: 'paid', amountCents: 20_000 });
      const replay = await w.as.anonymous.request('POST', '/api/payments/webhook', payload, {
        'stripe-signature': signWebhook(payload, w.t.payments.webhookSecret),
      });
      expect(replay.body).toEqual({ received: true, duplicate: true });
    });
    expect(paymentOf(w.a.paidSessionId)?.state).toBe('open');
  });
});
