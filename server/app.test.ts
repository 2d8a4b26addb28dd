import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { openDb } from '@/db';

import { createApp } from './app';

let base = '';
let close: () => void = () => {};
const webDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-web-'));

beforeAll(async () => {
  fs.mkdirSync(path.join(webDir, '_expo'), { recursive: true });
  fs.writeFileSync(path.join(webDir, 'index.html'), '<!doctype html><title>app shell</title>');
  fs.writeFileSync(path.join(webDir, '_expo', 'entry.js'), 'console.log(1)');
  const app = createApp({
    db: openDb(':memory:'),
    baseURL: 'http://127.0.0.1',
    secret: 'test-secret-test-secret-test-secret',
    webDir,
    uploadsDir: fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-up-')),
  });
  await new Promise<void>((resolve) => {
    const server = app.listen(0, '127.0.0.1', () => {
      base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
      close = () => server.close();
      resolve();
    });
  });
});
afterAll(() => close());

describe('serving the web export', () => {
  it('answers health checks', async () => {
    const res = await fetch(`${base}/api/health`);
    expect(await res.json()).toEqual({ ok: true });
  });

  it('serves the app shell for any page path, including deep links', async () => {
    for (const page of ['/', '/jobs', '/jobs/some-id/compare']) {
      const res = await fetch(base + page);
      expect(res.status, page).toBe(200);
      expect(res.headers.get('content-type')).toMatch(/text\/html/);
      expect(await res.text()).toContain('app shell');
    }
  });

  it('serves existing assets and answers 404 for missing ones instead of the shell', async () => {
    expect((await fetch(`${base}/_expo/entry.js`)).status).toBe(200);
    const missing = await fetch(`${base}/_expo/missing-bundle.js`);
    expect(missing.status).toBe(404);
    expect(await missing.text()).not.toContain('app shell');
  });

  it('answers unknown API paths with a JSON 404, never the shell', async () => {
    const res = await fetch(`${base}/api/no-such-route`);
    expect(res.status).toBe(404);
    expect(await res.json()).toMatchObject({ error: { code: 'not_found' } });
  });
});
