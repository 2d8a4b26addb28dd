import * as fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';

import {
  bodyHeaders,
  errorShapeProblems,
  webhookCall,
  invalidStoredRows,
  lobeUpload,
  malformedJson,
  mutatedBody,
  nastyParam,
  nastyQuery,
  pageQuery,
  photoUpload,
  prototypeShape,
  toForm,
  type Upload,
} from './fuzz';
import { appRoutes, fillPath, matrix } from './matrix';
import type { ApiRoute } from './routes';
import { buildWorld, isolated, type Actor, type World } from './world';

const writeMethods = ['POST', 'PATCH', 'PUT', 'DELETE'];
const apiRoutes = appRoutes().api;
/** Routes no actor passes by who they are (the signed webhook) get their own fuzz below. */
const signedRoutes = apiRoutes.filter((r) => matrix[r.key]?.refusedAs);
const writeRoutes = apiRoutes.filter((r) => writeMethods.includes(r.method) && !matrix[r.key]?.refusedAs);
const readRoutes = apiRoutes.filter((r) => r.method === 'GET');

/** Multipart routes and what generates their forms. */
const uploads: Record<string, fc.Arbitrary<Upload>> = {
  'POST /api/jobs/:jobId/photos': photoUpload,
  'POST /api/jobs/:jobId/measurements/lobes': lobeUpload,
};

/** Runs per route and kind of input: enough to hit every mutation kind, few enough to stay quick. `FUZZ_SCALE=20` digs deeper. */
const scale = Math.max(1, Number(process.env.FUZZ_SCALE) || 1);
const runs = { webhook: 60 * scale, body: 30 * scale, upload: 30 * scale, malformed: 6 * scale, headers: 4 * scale, param: 6 * scale, query: 4 * scale };

let w: World;
beforeAll(async () => {
  w = await buildWorld();
}, 60_000);
afterAll(() => w?.t.close());

/** Sends one request from the world's baseline and returns everything wrong with how the server took it. */
async function send(
  who: Actor,
  method: string,
  url: string,
  body: unknown,
  headers?: Record<string, string>,
): Promise<{ status: number; code?: string; problems: string[] }> {
  return isolated(w, async (probe) => {
    const prototypes = prototypeShape();
    const res = await w.as[who].request(method, url, body, headers);
    const problems = errorShapeProblems(res.status, res.body);
    const refusedPayment = (res.body as { error?: { code?: string } } | null)?.error?.code === 'amount_mismatch';
    if (res.status >= 500) problems.push(`${res.status}: ${JSON.stringify(res.body).slice(0, 200)}`);
    if (refusedPayment) {
      // A signed event for the wrong amount is refused and recorded on purpose (the event id, its outcome, an audit row); nothing is paid.
      if (
        w.t.db
          .select()
          .from(schema.payments)
          .all()
          .some((p) => p.state !== 'open' && p.checkoutSessionId === w.a.paidSessionId)
      )
        problems.push('a refused payment changed state');
      problems.push(...invalidStoredRows(w.t.db));
    } else if (res.status >= 400) {
      if (probe.dbChanged()) problems.push(`${res.status} but the database changed`);
      const files = probe.filesChanged();
      if (files.length) problems.push(`${res.status} but files changed: ${files.join(', ')}`);
    } else {
      problems.push(...invalidStoredRows(w.t.db));
    }
    if (
      prototypeShape() !== prototypes ||
      ({} as Record<string, unknown>).polluted !== undefined ||
      ([] as unknown as Record<string, unknown>).polluted !== undefined
    ) {
      problems.push('Object.prototype was polluted');
    }
    const code = (res.body as { error?: { code?: string } } | null)?.error?.code;
    return { status: res.status, code, problems };
  });
}

/** The first allowed actor whose valid request succeeds: the fuzz then reaches validation and the route's work itself. */
async function writer(route: ApiRoute): Promise<{ who: Actor; url: string; seed: (who: Actor) => unknown }> {
  const row = matrix[route.key];
  if (!row) throw new Error(`No matrix row for ${route.key}: add one to tests/api/matrix.ts`);
  const url = fillPath(route.path, row.params?.(w) ?? {});
  const seed = (who: Actor) => row.body?.(w, who) ?? (route.method === 'DELETE' || route.method === 'GET' ? undefined : {});
  for (const who of row.allow) {
    const { status } = await send(who, route.method, url, seed(who));
    if (status >= 200 && status < 300) return { who, url, seed };
  }
  throw new Error(`No one in the matrix row for ${route.key} gets a 2xx with its body`);
}

const expectClean = ({ problems }: { problems: string[] }) => {
  expect(problems).toEqual([]);
};

/** Odd path parameters (one at a time, the others valid) and odd query strings, with the valid body. */
async function fuzzAddress(route: ApiRoute, who: Actor, url: string, body: unknown, numRuns: { param: number; query: number }) {
  const names = [...route.path.matchAll(/:(\w+)/g)].map((m) => m[1]!);
  if (names.length) {
    const params = matrix[route.key]!.params?.(w) ?? {};
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...names), nastyParam, async (name, value) => {
        const odd = route.path.replace(/:(\w+)/g, (_m, n: string) => (n === name ? value : encodeURIComponent(params[n]!)));
        expectClean(await send(who, route.method, odd, body));
      }),
      { numRuns: numRuns.param },
    );
  }
  await fc.assert(
    fc.asyncProperty(nastyQuery, async (query) => expectClean(await send(who, route.method, `${url}?${query}`, body))),
    { numRuns: numRuns.query },
  );
}

describe('fuzzing every write route', { timeout: 60_000 * scale }, () => {
  it('covers every write route of the app', () => {
    expect(writeRoutes.length).toBeGreaterThan(20);
    expect(writeRoutes.filter((r) => !matrix[r.key]).map((r) => r.key)).toEqual([]);
  });

  it.each(writeRoutes.map((r) => [r.key, r] as const))('%s', async (key, route) => {
    const { who, url, seed } = await writer(route);
    const valid = seed(who);
    const upload = uploads[key];
    if (valid instanceof FormData) {
      expect(upload, `${key} takes a multipart form: add its generator to uploads in tests/api/fuzz.test.ts`).toBeDefined();
      await fc.assert(
        fc.asyncProperty(upload!, async (form) => expectClean(await send(who, route.method, url, toForm(form)))),
        { numRuns: runs.upload },
      );
    }
    const jsonSeed = valid instanceof FormData ? {} : valid;
    if (route.method !== 'DELETE') {
      await fc.assert(
        fc.asyncProperty(mutatedBody(jsonSeed), async (text) => expectClean(await send(who, route.method, url, text))),
        { numRuns: runs.body },
      );
      await fc.assert(
        fc.asyncProperty(malformedJson(jsonSeed), async (text) => expectClean(await send(who, route.method, url, text))),
        { numRuns: runs.malformed },
      );
      const text = JSON.stringify(jsonSeed);
      await fc.assert(
        fc.asyncProperty(bodyHeaders, async (headers) => expectClean(await send(who, route.method, url, text, headers))),
        { numRuns: runs.headers },
      );
    }
    await fuzzAddress(route, who, url, valid, runs);
  });

  it('PATCH /api/measurements/:id on a lobe table (checked against the stored kind)', async () => {
    const url = `/api/measurements/${w.a.lobesMeasurementId}`;
    const stored = (await w.as['A.tech'].get(url)).body.measurement;
    expect(stored.kind).toBe('lobes');
    const seed = { version: stored.version, data: stored.data };
    await fc.assert(
      fc.asyncProperty(mutatedBody(seed), async (text) => expectClean(await send('A.tech', 'PATCH', url, text))),
      { numRuns: runs.body },
    );
  });
});

describe('odd addresses on every read route', { timeout: 60_000 * scale }, () => {
  it.each(readRoutes.map((r) => [r.key, r] as const))('%s', async (_key, route) => {
    const { who, url } = await writer(route);
    await fuzzAddress(route, who, url, undefined, { param: 3 * scale, query: 3 * scale });
  });
});

describe('paged lists', { timeout: 60_000 * scale }, () => {
  const paged = ['GET /api/jobs', 'GET /api/incoming', 'GET /api/my/jobs'];
  it.each(paged)('%s answers a page or a 400 naming limit or cursor', async (key) => {
    const route = readRoutes.find((r) => r.key === key)!;
    const { who, url } = await writer(route);
    await fc.assert(
      fc.asyncProperty(pageQuery, async (q) => {
        const query = new URLSearchParams(Object.entries(q).filter((e): e is [string, string] => e[1] !== undefined)).toString();
        const result = await send(who, 'GET', `${url}?${query}`, undefined);
        expectClean(result);
        expect([200, 400]).toContain(result.status);
        if (result.status === 400) expect(result.code).toBe('invalid');
      }),
      { numRuns: 20 * scale },
    );
  });
});

describe('fuzzing the payment webhook', { timeout: 60_000 * scale }, () => {
  it('is the one signed route', () => {
    expect(signedRoutes.map((r) => r.key)).toEqual(['POST /api/payments/webhook']);
  });

  it('never fails on odd bodies and signatures, and refuses every delivery that is not signed with 400', async () => {
    const seen = { signed: 0, unsigned: 0 };
    await fc.assert(
      fc.asyncProperty(webhookCall(w.a.paidSessionId, w.t.payments.webhookSecret), fc.constantFrom<Actor>('anonymous', 'B.builder'), async (call, who) => {
        const result = await send(who, 'POST', '/api/payments/webhook', call.body, call.headers);
        expectClean(result);
        if (call.signed) expect(result.code).not.toBe('bad_signature');
        else expect([result.status, result.code]).toEqual([400, 'bad_signature']);
        seen[call.signed ? 'signed' : 'unsigned']++;
      }),
      { numRuns: runs.webhook },
    );
    // Both sides were reached: refused signatures and events the handler read.
    expect(seen.unsigned).toBeGreaterThan(0);
    expect(seen.signed).toBeGreaterThan(0);
  });
});
