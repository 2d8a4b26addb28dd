import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import os from 'node:os';
import path from 'node:path';

import { eq } from 'drizzle-orm';

import { DEMO_ENGINE, DEMO_TOWING } from '@/calc/demo';
import { openDb, schema, type Db } from '@/db';
import { createApp, type App, type CreateAppOptions } from '@/server/app';
import { startLocalPayments, type Payments } from '@/server/payments';
import type { FakePaymentService } from '@/server/payments/fake-service';
import type { ShopKind, ShopRole } from '@/shared/roles';

export type TestApp = { app: App; db: Db; url: string; uploadsDir: string; payments: Payments; paymentService: FakePaymentService; close: () => Promise<void> };

/** A real app on an in-memory database, listening on a free loopback port. */
export async function createTestApp(
  options: Pick<CreateAppOptions, 'calcRateLimit' | 'jobCreateRateLimit' | 'devTools' | 'shareRateLimit' | 'authRateLimit'> = {},
): Promise<TestApp> {
  const db = openDb(':memory:');
  const uploadsDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-test-uploads-'));
  // The origin is only known after listening; sign-in checks it against the request's Origin header.
  let server: Server | undefined;
  const port = await new Promise<number>((resolve) => {
    const probe = createApp({ db, baseURL: 'http://127.0.0.1', secret: 'test-secret-test-secret-test-secret', uploadsDir });
    const s = probe.listen(0, '127.0.0.1', () => {
      const p = (s.address() as AddressInfo).port;
      s.close(() => resolve(p));
    });
  });
  const url = `http://127.0.0.1:${port}`;
  // Deposits go to the local fake payment service, as they do when the app runs without STRIPE_SECRET_KEY.
  const { payments, service: paymentService } = await startLocalPayments({ publicUrl: url });
  const app = createApp({
    db,
    baseURL: url,
    secret: 'test-secret-test-secret-test-secret',
    uploadsDir,
    payments,
    jobCreateRateLimit: { limit: 10_000, windowMs: 60_000 },
    ...options,
  });
  await new Promise<void>((resolve) => {
    server = app.listen(port, '127.0.0.1', () => resolve());
  });
  return {
    app,
    db,
    url,
    uploadsDir,
    payments,
    paymentService,
    close: () =>
      new Promise<void>((resolve) => {
        server?.close(() => {
          fs.rmSync(uploadsDir, { recursive: true, force: true });
          void paymentService.close().then(() => resolve());
        });
      }),
  };
}

/** A fetch wrapper that keeps one person's session cookie, like a browser tab. */
export class Client {
  private cookies = new Map<string, string>();
  constructor(readonly baseUrl: string) {}

  /** `extraHeaders` replace the ones set here (e.g. another content-type). */
  async request(method: string, path: string, body?: unknown, extraHeaders: Record<string, string> = {}) {
    const headers: Record<string, string> = { origin: this.baseUrl };
    const form = body instanceof FormData;
    if (body !== undefined && !form) headers['content-type'] = 'application/json';
    Object.assign(headers, extraHeaders);
    if (this.cookies.size) headers.cookie = this.cookieHeader();
    const res = await fetch(this.baseUrl + path, {
      method,
      headers,
      body: body === undefined ? undefined : form ? body : typeof body === 'string' ? body : JSON.stringify(body),
    });
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair!.indexOf('=');
      const name = pair!.slice(0, eq);
      const value = pair!.slice(eq + 1);
      if (value === '' || /max-age=0/i.test(line)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    const text = await res.text();
    let json: unknown = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = text;
    }
    return { status: res.status, body: json as Record<string, any> };
  }

  /** The Cookie header this person's requests carry (for load tools that send their own requests). */
  cookieHeader = () => [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');

  /** Opens a link as a browser would, without following its redirect; returns the status and where it redirects. */
  async visit(pathAndQuery: string) {
    const res = await fetch(this.baseUrl + pathAndQuery, { headers: { origin: this.baseUrl, cookie: this.cookieHeader() }, redirect: 'manual' });
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair!.indexOf('=');
      const value = pair!.slice(eq + 1);
      if (value === '' || /max-age=0/i.test(line)) this.cookies.delete(pair!.slice(0, eq));
      else this.cookies.set(pair!.slice(0, eq), value);
    }
    await res.text();
    return { status: res.status, location: res.headers.get('location') };
  }

  get = (path: string) => this.request('GET', path);
  post = (path: string, body?: unknown) => this.request('POST', path, body ?? {});
  patch = (path: string, body?: unknown) => this.request('PATCH', path, body ?? {});
  put = (path: string, body?: unknown) => this.request('PUT', path, body ?? {});
  delete = (path: string) => this.request('DELETE', path);
  /** A multipart form post (fetch sets the boundary). */
  upload = (path: string, form: FormData) => this.request('POST', path, form);
  /** The raw response, for files. */
  fetchRaw = (path: string) =>
    fetch(this.baseUrl + path, {
      headers: { origin: this.baseUrl, cookie: this.cookieHeader() },
    });
}

/** A multipart form with files: `[field, name, bytes, type]`. */
export function formWith(files: [field: string, name: string, bytes: Uint8Array<ArrayBuffer> | string, type: string][], fields: Record<string, string> = {}) {
  const form = new FormData();
  for (const [field, name, bytes, type] of files) form.append(field, new Blob([bytes], { type }), name);
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  return form;
}

let counter = 0;

/** The last link in the newest mail to `email` whose subject matches, read from the outbox. */
export function linkFromOutbox(db: Db, email: string, subject: RegExp): string {
  const mail = db
    .select()
    .from(schema.outbox)
    .where(eq(schema.outbox.to, email))
    .all()
    .filter((m) => subject.test(m.subject))
    .at(-1);
  const link = mail?.text.match(/https?:\/\/\S+/g)?.at(-1);
  if (!link) throw new Error(`no mail matching ${subject} to ${email}`);
  return link;
}

/** Opens the verification link mailed to the client's address (as its owner would). */
export async function verifyEmail(t: TestApp, client: Client, email: string) {
  const link = new URL(linkFromOutbox(t.db, email, /verify/i));
  const res = await client.visit(link.pathname + link.search);
  if (res.status !== 302) throw new Error(`verification failed: ${res.status}`);
  return res;
}

/** Signs a new person up and returns their client; the address is verified unless `verified` is false. */
export async function signUp(t: TestApp, name = 'Test Person', { verified = true }: { verified?: boolean } = {}) {
  counter += 1;
  const email = `person${counter}-${Date.now()}@example.test`;
  const client = new Client(t.url);
  const res = await client.post('/api/auth/sign-up/email', { name, email, password: 'correct-horse-9' });
  if (res.status !== 200) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`);
  if (verified) await verifyEmail(t, client, email);
  return Object.assign(client, { email, userId: res.body.user.id as string });
}

/** Creates a shop with a founding member and returns its id. */
export async function makeShop(t: TestApp, kind: ShopKind = 'repair', name = 'Test shop') {
  const founder = await signUp(t, `${name} founder`);
  const res = await founder.post('/api/shops', { name, kind });
  if (res.status !== 201) throw new Error(`shop failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { shopId: res.body.activeShop.id as string, founder };
}

/** Adds a new person to a shop with the given role and signs them in (so their session opens in that shop). */
export async function memberWithRole(t: TestApp, shopId: string, role: ShopRole) {
  const person = await signUp(t, `A ${role}`);
  t.db.insert(schema.memberships).values({ id: crypto.randomUUID(), organizationId: shopId, userId: person.userId, role }).run();
  const res = await person.post('/api/me/active-shop', { shopId });
  if (res.status !== 200) throw new Error(`active shop failed: ${res.status} ${JSON.stringify(res.body)}`);
  return person;
}

export function makeJobBody(overrides: Record<string, unknown> = {}) {
  return {
    vehicle: 'Test one-ton flatbed, 5.9 L pushrod V8',
    customerName: 'Test Owner',
    complaint: 'Ticking at idle, misfire under load',
    mileage: 161000,
    ...overrides,
  };
}

/** A valid engine for `PUT /api/jobs/:id/engine` (the invented demo engine). */
export function makeEngineSpec(overrides: Record<string, unknown> = {}) {
  return { ...DEMO_ENGINE, spring: { ...DEMO_ENGINE.spring }, firingOrder: '1-8-4-3-6-5-7-2', ...overrides };
}

/** A valid profile spec (the invented demo towing profile). */
export function makeProfileSpec(overrides: Record<string, unknown> = {}) {
  return {
    ...DEMO_TOWING,
    intake: { ...DEMO_TOWING.intake },
    exhaust: { ...DEMO_TOWING.exhaust },
    baseCircle: DEMO_TOWING.baseCircle ?? null,
    ...overrides,
  };
}

export function makeProfileBody(overrides: Record<string, unknown> = {}) {
  return { label: 'Test towing profile', coreNotes: 'Test core', spec: makeProfileSpec(), ...overrides };
}

/** A shop with a builder, a job, the job's engine and one job profile: what a spec sheet needs. */
export async function makeJobWithEngine(t: TestApp, name = 'Sheet shop') {
  const { shopId, founder } = await makeShop(t, 'repair', name);
  const job = await founder.post('/api/jobs', makeJobBody());
  if (job.status !== 201) throw new Error(`job failed: ${job.status} ${JSON.stringify(job.body)}`);
  const jobId = job.body.job.id as string;
  const engine = await founder.put(`/api/jobs/${jobId}/engine`, { version: 0, engine: makeEngineSpec() });
  if (engine.status !== 201) throw new Error(`engine failed: ${engine.status} ${JSON.stringify(engine.body)}`);
  const profile = await founder.post(`/api/jobs/${jobId}/profiles`, makeProfileBody());
  if (profile.status !== 201) throw new Error(`profile failed: ${profile.status} ${JSON.stringify(profile.body)}`);
  return { shopId, founder, jobId, profileId: profile.body.profile.id as string };
}
