import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import { describe, expect, it } from 'vitest';

import { authSecret, readConfig } from './config';

const env = (vars: Record<string, string> = {}) => readConfig({ NODE_ENV: 'test', ...vars });

describe('AUTH_RATE_LIMIT', () => {
  it('is on unless set to off', () => {
    expect(env().authRateLimit).toBe(true);
    expect(env({ AUTH_RATE_LIMIT: 'on' }).authRateLimit).toBe(true);
    expect(env({ AUTH_RATE_LIMIT: 'off' }).authRateLimit).toBe(false);
  });

  it('refuses any other value, naming the variable', () => {
    expect(() => env({ AUTH_RATE_LIMIT: 'false' })).toThrow(/AUTH_RATE_LIMIT must be on or off, got false/);
  });
});

describe('WEB_CONCURRENCY', () => {
  it('is one process unless set, and takes a whole number of workers', () => {
    expect(env().webConcurrency).toBe(1);
    expect(env({ WEB_CONCURRENCY: '4' }).webConcurrency).toBe(4);
  });

  it('refuses anything else, naming the variable', () => {
    for (const bad of ['0', '-1', '2.5', 'many', '65']) expect(() => env({ WEB_CONCURRENCY: bad })).toThrow(/WEB_CONCURRENCY must be a whole number/);
  });
});

describe('the sign-in secret', () => {
  it('is BETTER_AUTH_SECRET when set', () => {
    expect(authSecret({ secret: 'x'.repeat(40), databasePath: '/nonexistent/db.sqlite' })).toBe('x'.repeat(40));
  });

  it('in demo mode without it, is made at random once, kept beside the database for this user only, and the same on the next start', () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-secret-'));
    try {
      const config = env({ DATABASE_PATH: path.join(dir, 'data', 'lobewright.sqlite') });
      expect(config.secret).toBeUndefined();
      const first = authSecret(config);
      expect(first).toMatch(/^[\w-]{43}$/);
      expect(authSecret(config)).toBe(first);
      expect(fs.statSync(path.join(dir, 'data', 'auth-secret')).mode & 0o777).toBe(0o600);
      // Another data folder gets its own.
      expect(authSecret(env({ DATABASE_PATH: path.join(dir, 'other', 'lobewright.sqlite') }))).not.toBe(first);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
