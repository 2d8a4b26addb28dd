import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { openDb, schema } from '@/db';
import { demoAccounts, seedDemo } from '@/db/seed';
import { freePort, root, startServer } from '@/tests/server-process';

import { createAuth } from './auth';
import { readConfig } from './config';
import { createMailer } from './mail';
import { demoAccountsWithPublishedPassword, sweepPartialUploads } from './startup';

const dirs: string[] = [];
const tempDir = () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-startup-'));
  dirs.push(dir);
  return dir;
};
afterAll(() => dirs.forEach((d) => fs.rmSync(d, { recursive: true, force: true })));

/** Runs the server from source until it exits, with `env` added; returns its exit code and output. */
function runServer(env: Record<string, string>) {
  const result = spawnSync(path.join(root, 'node_modules', '.bin', 'tsx'), ['server/index.ts'], {
    cwd: root,
    env: { ...process.env, ...env },
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { status: result.status, output: `${result.stdout}${result.stderr}` };
}

describe('demo and production modes', () => {
  it('reads demo mode unless NODE_ENV is production, with the dev mailbox and payment fake only in demo', () => {
    const demo = readConfig({ NODE_ENV: 'test' });
    expect(demo).toMatchObject({ mode: 'demo', devTools: true, payments: { kind: 'local-fake' }, trustProxy: false });
    const production = readConfig({ NODE_ENV: 'production', BETTER_AUTH_SECRET: 'x'.repeat(32) });
    expect(production).toMatchObject({ mode: 'production', devTools: false, payments: { kind: 'off' } });
    // The fake only when a setting asks for it; the real service only with both keys.
    expect(readConfig({ NODE_ENV: 'production', BETTER_AUTH_SECRET: 'x'.repeat(32), PAYMENTS: 'local-fake' }).payments.kind).toBe('local-fake');
    expect(() => readConfig({ NODE_ENV: 'production', BETTER_AUTH_SECRET: 'x'.repeat(32), PAYMENTS: 'service' })).toThrow(/STRIPE_SECRET_KEY/);
    expect(() => readConfig({ NODE_ENV: 'test', PAYMENTS: 'cash' })).toThrow(/PAYMENTS must be/);
    expect(readConfig({ NODE_ENV: 'test', TRUST_PROXY: 'loopback' }).trustProxy).toBe('loopback');
    expect(readConfig({ NODE_ENV: 'test', TRUST_PROXY: '1' }).trustProxy).toBe(1);
    expect(() => readConfig({ NODE_ENV: 'test', TRUST_PROXY: 'true' })).toThrow(/TRUST_PROXY/);
  });

  it('finds demo accounts that still have the published password, and not once it is changed', async () => {
    const db = openDb(path.join(tempDir(), 'demo.sqlite'));
    const auth = createAuth({ db, baseURL: 'http://localhost:8080', secret: 'test-secret-test-secret-test-secret', mailer: createMailer({ db }) });
    await seedDemo(db, auth);
    expect((await demoAccountsWithPublishedPassword(db)).sort()).toEqual(demoAccounts.map((a) => a.email).sort());
    const { hashPassword } = await import('better-auth/crypto');
    db.update(schema.accounts)
      .set({ password: await hashPassword('a-new-long-private-passphrase') })
      .run();
    expect(await demoAccountsWithPublishedPassword(db)).toEqual([]);
    db.$client.close();
  });

  it('refuses to serve in production while demo accounts keep the published password', async () => {
    const dir = tempDir();
    const file = path.join(dir, 'prod.sqlite');
    const db = openDb(file);
    await seedDemo(db, createAuth({ db, baseURL: 'http://localhost:8080', secret: 'test-secret-test-secret-test-secret', mailer: createMailer({ db }) }));
    db.$client.close();
    const run = runServer({
      NODE_ENV: 'production',
      BETTER_AUTH_SECRET: 'p'.repeat(40),
      DATABASE_PATH: file,
      PORT: String(await freePort()),
      ENV_FILE: path.join(dir, 'none.env'),
    });
    expect(run.status).toBe(1);
    expect(run.output).toMatch(/did not start: demo accounts still have the published demo password/);
  }, 90_000);

  it('names the mode and every fake in its start line, reads .env, and prints no sign-ins in production', async () => {
    const dir = tempDir();
    fs.writeFileSync(path.join(dir, 'settings.env'), `DATABASE_PATH=${path.join(dir, 'env.sqlite')}\nPAYMENTS=local-fake\n`);
    const demo = await startServer(await freePort(), { NODE_ENV: 'test', ENV_FILE: path.join(dir, 'settings.env') }, { timeoutMs: 60_000 });
    try {
      expect(demo.output()).toMatch(/in demo mode \(database .*env\.sqlite\)/);
      expect(demo.output()).toMatch(/Local fakes running: local test payment service at http:\/\/127\.0\.0\.1:\d+ \(no real money\); dev mailbox at \/mailbox/);
      expect((await (await fetch(`${demo.url}/api/instance`)).json()).instance).toEqual({ mode: 'demo', fakes: ['payments', 'mailbox'], depositsOn: true });
    } finally {
      await demo.stop();
    }
    const production = await startServer(
      await freePort(),
      { NODE_ENV: 'production', BETTER_AUTH_SECRET: 'p'.repeat(40), DATABASE_PATH: path.join(dir, 'fresh.sqlite'), ENV_FILE: path.join(dir, 'none.env') },
      { timeoutMs: 60_000 },
    );
    try {
      expect(production.output()).toMatch(/in production mode/);
      expect(production.output()).toMatch(/Card deposits are off/);
      expect(production.output()).not.toMatch(/Demo sign-ins|dev mailbox/);
      expect((await fetch(`${production.url}/api/dev/outbox`)).status).toBe(404);
      expect((await (await fetch(`${production.url}/api/instance`)).json()).instance).toEqual({ mode: 'production', fakes: [], depositsOn: false });
    } finally {
      await production.stop();
    }
  }, 180_000);

  it('exits non-zero with the reason when its port is taken, instead of claiming to serve (finding 8)', async () => {
    const blocker = net.createServer();
    const port = await new Promise<number>((resolve) => blocker.listen(0, () => resolve((blocker.address() as net.AddressInfo).port)));
    try {
      const run = runServer({ NODE_ENV: 'test', PORT: String(port), DATABASE_PATH: path.join(tempDir(), 'busy.sqlite'), PAYMENTS: 'off' });
      expect(run.status).toBe(1);
      expect(run.output).toMatch(new RegExp(`could not listen on port ${port}: .*EADDRINUSE`));
      expect(run.output).not.toMatch(/is serving/);
    } finally {
      blocker.close();
    }
  }, 90_000);
});

describe('unfinished uploads', () => {
  it('removes the .part files a killed upload left, in every shop folder, and nothing else', () => {
    const dir = tempDir();
    fs.mkdirSync(path.join(dir, 'shop-a'));
    fs.mkdirSync(path.join(dir, 'shop-b'));
    for (const f of ['shop-a/1.part', 'shop-b/2.part', 'shop-a/kept.png', 'shop-b/kept.jpg']) fs.writeFileSync(path.join(dir, f), 'x');
    expect(sweepPartialUploads(dir)).toBe(2);
    expect(
      fs
        .readdirSync(dir, { recursive: true })
        .map(String)
        .filter((f) => f.includes('.'))
        .sort(),
    ).toEqual([path.join('shop-a', 'kept.png'), path.join('shop-b', 'kept.jpg')]);
    expect(sweepPartialUploads(path.join(dir, 'missing'))).toBe(0);
  });
});
