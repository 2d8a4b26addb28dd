import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import type { Options } from 'express-rate-limit';
import { afterAll, describe, expect, it, vi } from 'vitest';

import { openDb } from '@/db';

import { databaseRateLimitStore } from './rate-limits';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-rate-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

/** A store as express-rate-limit sets it up, with a one-minute window. */
function store(file: string, prefix: string, windowMs = 60_000) {
  const s = databaseRateLimitStore(openDb(file), prefix);
  s.init?.({ windowMs } as Options);
  return s;
}

describe('rate-limit hits kept in the database', () => {
  it('counts one client together from two connections to one file, as two server processes would', async () => {
    const file = path.join(dir, 'shared.sqlite');
    const [a, b] = [store(file, 'calc:'), store(file, 'calc:')];
    expect((await a.increment('user:1')).totalHits).toBe(1);
    expect((await b.increment('user:1')).totalHits).toBe(2);
    expect((await a.increment('user:1')).totalHits).toBe(3);
    expect((await b.get?.('user:1'))?.totalHits).toBe(3);
    // Another client, and another limiter's prefix, count on their own.
    expect((await b.increment('user:2')).totalHits).toBe(1);
    expect((await store(file, 'share:').increment('user:1')).totalHits).toBe(1);
    await b.decrement('user:1');
    expect((await a.get?.('user:1'))?.totalHits).toBe(2);
    await a.resetKey('user:1');
    expect(await b.get?.('user:1')).toBeUndefined();
  });

  it('starts a new window at one once the old one has ended, and says when the window ends', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    try {
      vi.setSystemTime(new Date('2026-12-03T10:00:00.000Z'));
      const s = store(path.join(dir, 'window.sqlite'), 'calc:', 60_000);
      await s.increment('user:1');
      const second = await s.increment('user:1');
      expect(second).toEqual({ totalHits: 2, resetTime: new Date('2026-12-03T10:01:00.000Z') });
      vi.setSystemTime(new Date('2026-12-03T10:01:00.001Z'));
      expect(await s.get?.('user:1')).toBeUndefined();
      expect(await s.increment('user:1')).toEqual({ totalHits: 1, resetTime: new Date('2026-12-03T10:02:00.001Z') });
    } finally {
      vi.useRealTimers();
    }
  });
});
