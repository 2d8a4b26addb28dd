import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';

import { createTestApp, makeJobBody, type TestApp } from '@/tests/fixtures';

import { fieldsFromZod, HttpError, parse } from './http';

/** JSON text with own keys named like `Object.prototype`'s, as a client can send them. */
const withKeys = (base: Record<string, unknown>, keys: [string, unknown][]) => {
  const text = JSON.stringify(base);
  const extra = keys.map(([k, v]) => `${JSON.stringify(k)}:${JSON.stringify(v)}`);
  return `${text.slice(0, -1)},${extra.join(',')}}`;
};

describe('fieldsFromZod', () => {
  it('names unknown keys that look like Object.prototype members, and an empty key', () => {
    const schema = z.strictObject({ a: z.number(), nested: z.strictObject({ b: z.number() }) });
    const body = JSON.parse(
      withKeys({ a: 1, nested: { b: 2 } }, [
        ['__proto__', {}],
        ['prototype', 1],
        ['', 3],
      ]).replace('"b":2', '"b":2,"constructor":1'),
    );
    const result = schema.safeParse(body);
    expect(result.success).toBe(false);
    const fields = fieldsFromZod(result.error!);
    expect(Object.keys(fields).sort()).toEqual(['""', '__proto__', 'nested.constructor', 'prototype']);
    expect(Object.values(fields)).toEqual(['Unknown field', 'Unknown field', 'Unknown field', 'Unknown field']);
  });

  it('names an unknown key of only spaces in quotes, so the field is never blank', () => {
    const result = z.strictObject({ sessionId: z.string() }).safeParse({ sessionId: 'x', ' ': 1, '\t ': 2 });
    expect(Object.keys(fieldsFromZod(result.error!))).toEqual(['" "', '"\\t "']);
  });
});

describe('parse', () => {
  /** `[[[…[1]…]]]` nested `depth` deep, as a client can send it inside a free-form field. */
  const nested = (depth: number) => JSON.parse(`${'['.repeat(depth)}1${']'.repeat(depth)}`) as unknown;

  it('refuses a value nested thousands deep with a 400 naming the field, not a stack overflow', () => {
    const schema = z.object({ data: z.unknown() });
    let thrown: unknown;
    try {
      parse(schema, { data: nested(5000) });
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(HttpError);
    const { status, fields } = thrown as HttpError;
    expect(status).toBe(400);
    expect(Object.values(fields ?? {})).toEqual(['Nested more than 32 levels deep']);
    expect(Object.keys(fields ?? {})[0]).toMatch(/^data/);
  });

  it('still takes ordinary nesting', () => {
    expect(parse(z.object({ data: z.unknown() }), { data: nested(20) })).toEqual({ data: nested(20) });
  });
});

describe('answers to requests the routes never see', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  const send = async (path: string, init: RequestInit = {}) => {
    const res = await fetch(t.url + path, { ...init, headers: { 'content-type': 'application/json', origin: t.url, ...init.headers } });
    return { status: res.status, body: (await res.json()) as { error: { code: string; message: string; fields?: Record<string, string> } } };
  };

  it('names __proto__ and constructor when a body carries them as extra fields', async () => {
    for (const key of ['__proto__', 'constructor']) {
      const res = await send('/api/jobs', { method: 'POST', body: withKeys(makeJobBody(), [[key, { polluted: 'yes' }]]) });
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ [key]: 'Unknown field' });
      expect(res.body.error.message).toBe(`${key}: Unknown field`);
    }
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('answers a broken %-escape in the path with a 400 that names the path', async () => {
    for (const path of ['/api/jobs/%ZZ', '/api/jobs/%', '/api/profiles/%E0%A4%A']) {
      const res = await send(path, { method: 'PATCH', body: '{"version":1}' });
      expect(res.status, path).toBe(400);
      expect(res.body.error).toMatchObject({ code: 'invalid_path', fields: { '(path)': expect.stringContaining('%') } });
    }
  });

  it('answers a body it cannot decompress or decode with an error that names the body', async () => {
    const gzip = await send('/api/jobs', { method: 'POST', headers: { 'content-encoding': 'gzip' }, body: 'not gzip at all' });
    expect(gzip.status).toBe(400);
    expect(gzip.body.error).toMatchObject({ code: 'unreadable_body', fields: { '(body)': 'incorrect header check' } });
    const charset = await send('/api/jobs', { method: 'POST', headers: { 'content-type': 'application/json; charset=klingon' }, body: '{}' });
    expect(charset.status).toBe(415);
    expect(charset.body.error).toMatchObject({ code: 'unreadable_body', fields: { '(body)': expect.stringContaining('charset') } });
  });

  it('answers malformed JSON with a 400 that names the body', async () => {
    const res = await send('/api/jobs', { method: 'POST', body: '{"vehicle": ' });
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual({ code: 'invalid_json', message: 'The body is not valid JSON', fields: { '(body)': 'Not valid JSON' } });
  });
});
