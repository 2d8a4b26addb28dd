import { describe, expect, it } from 'vitest';

import { readConfig } from './config';

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
