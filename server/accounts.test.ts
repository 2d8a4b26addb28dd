import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { demoPassword } from '@/db/seed';
import { Client, createTestApp, linkFromOutbox, makeShop, memberWithRole, signUp, type TestApp } from '@/tests/fixtures';

import { disabledAccountPaths, disabledOrganizationPaths } from './auth';
import { isCommonPassword } from './passwords';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

let n = 0;
const address = () => `accounts-${++n}-${Date.now()}@example.test`;

describe('passwords', () => {
  it.each([
    ['ten spaces', ' '.repeat(10)],
    ['ten times one letter', 'aaaaaaaaaa'],
    ['twelve times one letter', 'aaaaaaaaaaaa'],
    ['ten digits in a row', '1234567890'],
    ['a common password of twelve characters', 'password1234'],
    ['only spaces, long enough', ' '.repeat(14)],
  ])('refuses %s at sign-up with a 400 naming the password field', async (_label, password) => {
    const res = await new Client(t.url).post('/api/auth/sign-up/email', { name: 'Weak Password', email: address(), password });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/^password: /);
    expect(Object.keys(res.body.fields)).toEqual(['password']);
  });

  it('keeps the common list on known common passwords and off the demo password', () => {
    // Entries from the package's list of common passwords.
    expect(isCommonPassword('password1234')).toBe(true);
    expect(isCommonPassword('qwertyuiop')).toBe(true);
    expect(isCommonPassword('PASSWORD1234')).toBe(true);
    expect(isCommonPassword(demoPassword)).toBe(false);
  });

  it('takes a long uncommon password', async () => {
    const res = await new Client(t.url).post('/api/auth/sign-up/email', { name: 'Good Password', email: address(), password: demoPassword });
    expect(res.status).toBe(200);
  });
});

describe('e-mail verification', () => {
  it('signs an unverified person in, mails a link that lands on our verified page, and marks the address verified', async () => {
    const email = address();
    const client = new Client(t.url);
    expect((await client.post('/api/auth/sign-up/email', { name: 'New Person', email, password: 'correct-horse-9' })).status).toBe(200);
    expect((await client.get('/api/auth/get-session')).body.user).toMatchObject({ email, emailVerified: false });
    expect((await client.get('/api/me')).body.user).toMatchObject({ email, emailVerified: false });
    const link = new URL(linkFromOutbox(t.db, email, /verify/i));
    const res = await client.visit(link.pathname + link.search);
    expect(res.status).toBe(302);
    expect(new URL(res.location!, t.url).pathname).toBe('/verified');
    expect(t.db.select().from(schema.users).where(eq(schema.users.email, email)).get()!.emailVerified).toBe(true);
    expect((await client.get('/api/me')).body.user).toMatchObject({ email, emailVerified: true });
  });

  it('sends the verification mail again on request', async () => {
    const email = address();
    const client = new Client(t.url);
    await client.post('/api/auth/sign-up/email', { name: 'Resend Person', email, password: 'correct-horse-9' });
    const res = await client.post('/api/auth/send-verification-email', { email, callbackURL: '/verified' });
    expect(res.status).toBe(200);
    expect(t.db.select().from(schema.outbox).where(eq(schema.outbox.to, email)).all().length).toBe(2);
  });
});

describe('password reset', () => {
  it('mails a reset link, refuses a common new password, and signs in with the new one', async () => {
    const person = await signUp(t, 'Forgetful Person');
    expect((await new Client(t.url).post('/api/auth/request-password-reset', { email: person.email, redirectTo: '/reset-password' })).status).toBe(200);
    const link = new URL(linkFromOutbox(t.db, person.email, /password/i));
    const opened = await new Client(t.url).visit(link.pathname + link.search);
    expect(opened.status).toBe(302);
    const landing = new URL(opened.location!, t.url);
    expect(landing.pathname).toBe('/reset-password');
    const token = landing.searchParams.get('token')!;
    const weak = await new Client(t.url).post('/api/auth/reset-password', { token, newPassword: 'password1234' });
    expect(weak.status).toBe(400);
    expect(weak.body.fields).toHaveProperty('newPassword');
    expect((await new Client(t.url).post('/api/auth/reset-password', { token, newPassword: 'brand-new-secret-7' })).status).toBe(200);
    expect((await new Client(t.url).post('/api/auth/sign-in/email', { email: person.email, password: 'correct-horse-9' })).status).toBe(401);
    expect((await new Client(t.url).post('/api/auth/sign-in/email', { email: person.email, password: 'brand-new-secret-7' })).status).toBe(200);
  });
});

describe('organization endpoints', () => {
  it('refuses a customer listing the shop members or reading the full shop', async () => {
    const { shopId } = await makeShop(t, 'repair', 'Private shop');
    const customer = await memberWithRole(t, shopId, 'customer');
    expect((await customer.get(`/api/auth/organization/list-members?organizationId=${shopId}`)).status).toBe(404);
    expect((await customer.get(`/api/auth/organization/get-full-organization?organizationId=${shopId}`)).status).toBe(404);
  });

  it('refuses creating a shop through the plugin, with any kind', async () => {
    const person = await signUp(t, 'Shop Maker');
    const res = await person.post('/api/auth/organization/create', { name: 'Bogus', slug: `bogus-${Date.now()}`, kind: 'bogus' });
    expect(res.status).toBe(404);
    expect(t.db.select().from(schema.shops).where(eq(schema.shops.name, 'Bogus')).all()).toEqual([]);
  });
});

describe('auth endpoints left on', () => {
  // Every better-auth endpoint that answers, each with who may call it; a new one must be added here on purpose.
  const onPurpose: Record<string, string> = {
    '/callback/:id': 'social sign-in callback; no providers are configured, so it has nothing to call back',
    '/change-password': 'signed-in person, own password (checked against our rules)',
    '/error': 'anyone: the error page',
    '/get-session': 'anyone: own session or null',
    '/list-sessions': 'signed-in person: own sessions',
    '/ok': 'anyone: health',
    '/request-password-reset': 'anyone: same answer whether the address has an account or not',
    '/reset-password': 'holder of a reset token',
    '/reset-password/:token': 'holder of a reset token (the mailed link)',
    '/revoke-other-sessions': 'signed-in person: own sessions',
    '/revoke-session': 'signed-in person: own sessions',
    '/revoke-sessions': 'signed-in person: own sessions',
    '/send-verification-email': 'anyone: mails only the address on the account',
    '/sign-in/email': 'anyone, rate-limited',
    '/sign-out': 'signed-in person',
    '/sign-up/email': 'anyone, rate-limited',
    '/verify-email': 'holder of a verification token',
  };

  it('are exactly the ones we mean to offer', () => {
    const off = new Set([...disabledAccountPaths, ...disabledOrganizationPaths]);
    const on = Object.values(t.app.auth.api as Record<string, { path?: string }>)
      .map((endpoint) => endpoint.path)
      .filter((p): p is string => typeof p === 'string' && !off.has(p));
    expect([...new Set(on)].sort()).toEqual(Object.keys(onPurpose).sort());
  });

  it.each(disabledAccountPaths.filter((p) => !p.includes(':')))('answers 404 on %s', async (p) => {
    const person = await signUp(t, 'Probe Person');
    expect((await person.post(`/api/auth${p}`, { name: 'x', newEmail: 'someone-else@example.test' })).status).toBe(404);
  });
});
