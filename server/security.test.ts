import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { openDb } from '@/db';
import { Client, createTestApp, makeJobBody, makeShop, signUp, type TestApp } from '@/tests/fixtures';

import { createApp } from './app';
import { clientAddressHeader, defaultAuthRateLimit, type AuthRateLimit } from './security';

const password = 'correct-horse-9';

/** A POST from a chosen loopback source address (fetch always uses 127.0.0.1). */
function postFrom(localAddress: string, url: string, body: unknown): Promise<{ status: number; body: unknown }> {
  return new Promise((resolve, reject) => {
    const target = new URL(url);
    const data = JSON.stringify(body);
    const req = http.request(
      {
        host: target.hostname,
        port: target.port,
        path: target.pathname,
        method: 'POST',
        localAddress,
        headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(data), origin: target.origin },
      },
      (res) => {
        let text = '';
        res.on('data', (chunk: Buffer) => (text += chunk.toString()));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text ? JSON.parse(text) : null }));
      },
    );
    req.on('error', reject);
    req.end(data);
  });
}

/** An app built with createApp on its own origin, listening on a free loopback port. */
async function listen(baseURL: string, extra: { webDir?: string } = {}) {
  const app = createApp({
    db: openDb(':memory:'),
    baseURL,
    secret: 'test-secret-test-secret-test-secret',
    uploadsDir: fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-security-up-')),
    authRateLimit: false,
    ...extra,
  });
  const server = await new Promise<http.Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, close: () => server.close() };
}

describe('sign-in rate limit', () => {
  const limits: AuthRateLimit = { signIn: { max: 3, window: 60 }, signUp: { max: 2, window: 60 }, other: { max: 100, window: 60 } };
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ authRateLimit: limits });
  });
  afterAll(() => t.close());

  it('answers the attempt after the limit with 429 in the app error shape, even with the right password', async () => {
    const person = await signUp(t, 'Rate Person');
    const client = new Client(t.url);
    for (let i = 0; i < limits.signIn.max; i++) {
      const wrong = await client.post('/api/auth/sign-in/email', { email: person.email, password: 'wrong-password-1' });
      expect(wrong.status, `attempt ${i + 1}`).toBe(401);
    }
    const res = await fetch(`${t.url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: t.url },
      body: JSON.stringify({ email: person.email, password }),
    });
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(res.headers.get('set-cookie')).toBeNull();
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('rate_limited');
    expect(body.error.message).toMatch(/Wait \d+ seconds/);
  });

  it('counts by the connecting address, which a client cannot pick with a header', async () => {
    const spoofed = await fetch(`${t.url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: t.url, [clientAddressHeader]: '198.51.100.7' },
      body: JSON.stringify({ email: 'nobody@example.test', password }),
    });
    expect(spoofed.status).toBe(429);

    const person = await signUp(t, 'Second Address Person');
    const other = await postFrom('127.0.0.2', `${t.url}/api/auth/sign-in/email`, { email: person.email, password });
    expect(other.status).toBe(200);
  });

  it('ignores X-Forwarded-For unless TRUST_PROXY names a proxy, so a local client cannot dodge the limit (finding 8)', async () => {
    const forwarded = await fetch(`${t.url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: t.url, 'x-forwarded-for': '203.0.113.9' },
      body: JSON.stringify({ email: 'nobody@example.test', password }),
    });
    expect(forwarded.status).toBe(429);
  });

  it('limits sign-ups separately from sign-ins', async () => {
    // Two sign-ups above used the whole allowance of this address.
    const res = await new Client(t.url).post('/api/auth/sign-up/email', { name: 'One Too Many', email: 'one-more@example.test', password });
    expect(res.status).toBe(429);
    expect(res.body.error.code).toBe('rate_limited');
  });
});

describe('with the limit off (tests and the browser suite)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ authRateLimit: false });
  });
  afterAll(() => t.close());

  it('lets one address sign in more often than the production limit allows', async () => {
    const person = await signUp(t, 'Frequent Person');
    for (let i = 0; i <= defaultAuthRateLimit.signIn.max; i++) {
      const res = await new Client(t.url).post('/api/auth/sign-in/email', { email: person.email, password });
      expect(res.status, `sign-in ${i + 1}`).toBe(200);
    }
  }, 30_000);
});

describe('session cookie', () => {
  async function signUpCookie(baseURL: string) {
    const app = await listen(baseURL);
    try {
      const res = await fetch(`${app.url}/api/auth/sign-up/email`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', origin: baseURL },
        body: JSON.stringify({ name: 'Cookie Person', email: 'cookie@example.test', password }),
      });
      expect(res.status).toBe(200);
      const session = res.headers.getSetCookie().find((c) => c.includes('session_token='));
      if (!session) throw new Error('no session cookie');
      return session;
    } finally {
      app.close();
    }
  }

  it('is Secure with the __Secure- prefix, HttpOnly and SameSite=Lax when the public origin is HTTPS', async () => {
    const cookie = await signUpCookie('https://lobewright.example');
    expect(cookie).toMatch(/^__Secure-/);
    expect(cookie).toMatch(/;\s*Secure/i);
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
  });

  it('is HttpOnly and SameSite=Lax, without Secure, on a plain-HTTP origin such as localhost', async () => {
    const cookie = await signUpCookie('http://localhost:8080');
    expect(cookie).not.toMatch(/^__Secure-/);
    expect(cookie).not.toMatch(/;\s*Secure/i);
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
  });
});

describe('security headers', () => {
  const webDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-security-web-'));
  fs.writeFileSync(path.join(webDir, 'index.html'), '<!doctype html><title>app shell</title>');

  it('sends a Content Security Policy the web export runs under, and no framing', async () => {
    const app = await listen('http://localhost:8080', { webDir });
    try {
      const res = await fetch(`${app.url}/jobs`);
      expect(res.status).toBe(200);
      const csp = res.headers.get('content-security-policy') ?? '';
      expect(csp).toContain("default-src 'self'");
      expect(csp).toContain("script-src 'self'");
      expect(csp).not.toMatch(/script-src[^;]*unsafe/);
      expect(csp).toContain("img-src 'self' data: blob:");
      expect(csp).toContain("frame-ancestors 'none'");
      expect(csp).not.toContain('upgrade-insecure-requests');
      expect(res.headers.get('x-frame-options')).toBe('DENY');
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('referrer-policy')).toBe('no-referrer');
      expect(res.headers.get('strict-transport-security')).toBeNull();
      expect(res.headers.get('x-powered-by')).toBeNull();

      const api = await fetch(`${app.url}/api/health`);
      expect(api.headers.get('x-content-type-options')).toBe('nosniff');
    } finally {
      app.close();
    }
  });

  it('adds HSTS and upgrade-insecure-requests when the public origin is HTTPS', async () => {
    const app = await listen('https://lobewright.example', { webDir });
    try {
      const res = await fetch(`${app.url}/`);
      expect(res.headers.get('strict-transport-security')).toMatch(/max-age=\d+/);
      expect(res.headers.get('content-security-policy')).toContain('upgrade-insecure-requests');
    } finally {
      app.close();
    }
  });
});

describe('request body limits', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  const tooLarge = { error: { code: 'too_large', message: expect.stringMatching(/too large/) } };

  it('answers a JSON body over 200 KB on the API with 413 and saves nothing', async () => {
    const { founder } = await makeShop(t, 'repair', 'Body limit shop');
    const res = await founder.post('/api/jobs', makeJobBody({ findings: 'x'.repeat(210 * 1024) }));
    expect(res.status).toBe(413);
    expect(res.body).toEqual(tooLarge);
    expect((await founder.get('/api/jobs')).body.jobs).toEqual([]);
  });

  it('answers a sign-in body over 64 KB with 413 in the same shape', async () => {
    const res = await new Client(t.url).post('/api/auth/sign-in/email', { email: 'big@example.test', password: 'p'.repeat(70 * 1024) });
    expect(res.status).toBe(413);
    expect(res.body).toEqual(tooLarge);
  });

  it('stops reading a sign-up body sent without a length once it passes the limit', async () => {
    const chunk = new TextEncoder().encode(`{"name":"${'n'.repeat(16 * 1024)}`);
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (sent >= 20) return controller.close();
        sent += 1;
        controller.enqueue(chunk);
      },
    });
    const res = await fetch(`${t.url}/api/auth/sign-up/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: t.url },
      body: stream,
      duplex: 'half',
    } as RequestInit);
    expect(res.status).toBe(413);
    expect(await res.json()).toEqual(tooLarge);
  });

  it('answers a form-encoded sign-in over the limit with 413 too', async () => {
    const res = await fetch(`${t.url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: t.url },
      body: `email=big%40example.test&password=${'p'.repeat(70 * 1024)}`,
    });
    expect(res.status).toBe(413);
    expect(await res.json()).toEqual(tooLarge);
  });
});

describe('state-changing routes check the Origin, as the sign-in routes do (finding 8)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('refuses a cookie-carrying write from another site or from nowhere, whatever its body, and takes our own', async () => {
    const { founder } = await makeShop(t, 'repair', 'Origin shop');
    const before = (await founder.get('/api/jobs')).body.jobs.length;
    const form = new FormData();
    form.set('vehicle', 'Test vehicle');
    const attempts: [string, unknown, Record<string, string>][] = [
      ['/api/jobs', makeJobBody(), { origin: 'https://elsewhere.example' }],
      ['/api/jobs', JSON.stringify(makeJobBody()), { origin: 'https://elsewhere.example', 'content-type': 'text/plain' }],
      ['/api/jobs', form, { origin: 'https://elsewhere.example' }],
      ['/api/jobs', undefined, { origin: 'null' }],
      ['/api/jobs', makeJobBody(), { origin: '' }],
      ['/api/me/active-shop', undefined, { origin: '', referer: 'https://elsewhere.example/page' }],
    ];
    for (const [path, body, headers] of attempts) {
      const res = await founder.request('POST', path, body, headers);
      expect(res.status, JSON.stringify(headers)).toBe(403);
      expect(res.body.error.code).toBe('origin_refused');
    }
    expect((await founder.get('/api/jobs')).body.jobs.length).toBe(before);
    // Our own origin, or a Referer from our own pages when a browser sends no Origin, goes through.
    expect((await founder.post('/api/jobs', makeJobBody())).status).toBe(201);
    expect((await founder.request('POST', '/api/jobs', makeJobBody(), { origin: '', referer: `${t.url}/jobs` })).status).toBe(201);
  });
});

describe('text and uploads that the parsers refuse with a 400 naming the field (finding 8)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('refuses NUL and other control characters in text, naming the field, and keeps tabs and new lines', async () => {
    const { founder } = await makeShop(t, 'repair', 'Control shop');
    for (const bad of ['Test\u0000vehicle', 'Test\u001bvehicle', 'Test\u007fvehicle']) {
      const res = await founder.post('/api/jobs', makeJobBody({ vehicle: bad }));
      expect(res.status).toBe(400);
      expect(res.body.error.fields.vehicle).toMatch(/control characters/);
    }
    const ok = await founder.post('/api/jobs', makeJobBody({ complaint: 'Line one\n\tLine two' }));
    expect(ok.status).toBe(201);
  });

  it('answers a malformed multipart part header with 400 naming the upload field, not 500', async () => {
    const { founder } = await makeShop(t, 'repair', 'Multipart shop');
    const job = (await founder.post('/api/jobs', makeJobBody())).body.job;
    const boundary = 'lobewrightboundary';
    const body = `--${boundary}\r\nContent-Disposition form-data name="photos"; filename="a.png"\r\nContent-Type: image/png\r\n\r\nxxxx\r\n--${boundary}--\r\n`;
    for (const path of [`/api/jobs/${job.id}/photos`, `/api/jobs/${job.id}/measurements/lobes`]) {
      const res = await founder.request('POST', path, body, { 'content-type': `multipart/form-data; boundary=${boundary}` });
      expect(res.status, path).toBe(400);
      expect(Object.keys(res.body.error.fields), path).toEqual([path.endsWith('photos') ? 'photos' : 'file']);
    }
  });

  it('bounds lobe-table angles to -360…720 crank degrees (1e300 is refused)', async () => {
    const { founder } = await makeShop(t, 'repair', 'Angle shop');
    const job = (await founder.post('/api/jobs', makeJobBody())).body.job;
    for (const first of ['1e300', '-400', '721']) {
      const rows = [first, '-20', '0', '20', '40', '60'].map((a, i) => `${a},${(0.01 * i).toFixed(3)}`);
      const form = new FormData();
      form.set('file', new Blob([`angle,1I\n${rows.join('\n')}\n`], { type: 'text/csv' }), 'lobes.csv');
      const res = await founder.request('POST', `/api/jobs/${job.id}/measurements/lobes`, form);
      expect(res.status, first).toBe(400);
      expect(JSON.stringify(res.body.error), first).toMatch(/-360…720 crank degrees/);
    }
  });
});
