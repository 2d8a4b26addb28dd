import * as fc from 'fast-check';
import { z as zod, type z } from 'zod';

import { schema, type Db } from '@/db';
import { engineSchema } from '@/shared/engine';
import { jobPatchSchema } from '@/shared/jobs';
import { shopCreateSchema } from '@/shared/me';
import {
  checklistAddSchema,
  measurementDataSchemas,
  measurementPatchSchema,
  photoMimeTypes,
  photoPatchSchema,
  shopLimitsSaveSchema,
} from '@/shared/measurements';
import { messageSchema, orderMoveSchema, orderStages } from '@/shared/orders';
import { approveSchema, ownerOptionCreateSchema, ownerPageSchema } from '@/shared/owner';
import { profileCreateSchema, profileLabelSchema, profileSpecSchema } from '@/shared/profile';
import { sheetCreateSchema, sheetSaveSchema } from '@/shared/sheets';

import { lobeTableRows, paymentEvent, signWebhook } from './world';

/** Keys that reach `Object.prototype` when code copies them carelessly. */
export const pollutionKeys = ['__proto__', 'constructor', 'prototype'] as const;

/** Sets an own property, even one named `__proto__` (plain assignment would set the prototype instead). */
function setOwn(target: Record<string, unknown> | unknown[], key: string | number, value: unknown) {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}

function nested(depth: number): unknown {
  let value: unknown = 1;
  for (let i = 0; i < depth; i++) value = [value];
  return value;
}

const pollution = fc.constantFrom(...pollutionKeys).map((key) => {
  const inner = {};
  setOwn(inner, 'polluted', 'yes');
  const outer = {};
  setOwn(outer, key, key === 'constructor' ? { prototype: inner } : inner);
  return outer;
});

/** Values no field expects: numbers as strings, extremes, NaN and Infinity, unicode, huge strings, wrong shapes. */
export const nastyValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e309', '-0', '0x1F', '', '   ', '\u0000', 'null', 'true', '[]', '{}', '__proto__'),
  fc.constantFrom(-1, 0, -0, 0.5, 1e308, -1e308, 5e-324, 2 ** 31, -(2 ** 63), Number.MAX_SAFE_INTEGER + 2, Number.MIN_SAFE_INTEGER - 2),
  fc.double(),
  fc.integer(),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.integer({ min: 4_000, max: 20_000 }).map((n) => 'Ж'.repeat(n)),
  fc.constantFrom(null, true, false, [], {}),
  fc.array(fc.oneof(fc.integer(), fc.string()), { maxLength: 4 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.oneof(fc.integer(), fc.string({ maxLength: 8 })), { maxKeys: 3 }),
  fc.integer({ min: 50, max: 3_000 }).map(nested),
  pollution,
);

type Path = (string | number)[];

/** Every place in `value` (objects and arrays, nested up to eight deep) a mutation can reach. */
function pathsOf(value: unknown, at: Path = []): Path[] {
  if (value === null || typeof value !== 'object' || at.length >= 8) return [at];
  const entries: [string | number, unknown][] = Array.isArray(value) ? value.map((v, i) => [i, v]) : Object.entries(value);
  return [at, ...entries.flatMap(([k, v]) => pathsOf(v, [...at, k]))];
}

const clone = <T>(value: T): T => (value === undefined ? value : (JSON.parse(JSON.stringify(value)) as T));

function containerAt(root: unknown, path: Path): unknown {
  let node = root;
  for (const key of path) node = (node as Record<string | number, unknown>)[key];
  return node;
}

type Mutation =
  | { op: 'set'; pick: number; value: unknown }
  | { op: 'scale'; pick: number; factor: number }
  | { op: 'drop'; pick: number }
  | { op: 'extra'; pick: number; key: string; value: unknown };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constant('set' as const), pick: fc.nat(), value: nastyValue }),
  fc.record({ op: fc.constant('scale' as const), pick: fc.nat(), factor: fc.double({ min: -3, max: 3, noNaN: true }) }),
  fc.record({ op: fc.constant('drop' as const), pick: fc.nat() }),
  fc.record({
    op: fc.constant('extra' as const),
    pick: fc.nat(),
    key: fc.oneof(fc.constantFrom(...pollutionKeys, 'toString', 'hasOwnProperty', 'valueOf', 'id', 'shopId'), fc.string({ maxLength: 12 })),
    value: fc.oneof(nastyValue, pollution),
  }),
);

/** Applies the mutations to a copy of `seed`; `pick` chooses a place modulo how many there are. */
function mutate(seed: unknown, mutations: Mutation[]): unknown {
  let body = clone(seed);
  for (const generated of mutations) {
    // Generated values can be shared between runs: each mutation gets its own copy (JSON keeps own `__proto__` keys).
    const m = 'value' in generated ? { ...generated, value: clone(generated.value) } : generated;
    if (m.op === 'scale') {
      const numbers = pathsOf(body).filter((p) => p.length > 0 && typeof containerAt(body, p) === 'number');
      const path = numbers[m.pick % Math.max(numbers.length, 1)];
      if (!path) continue;
      const parent = containerAt(body, path.slice(0, -1)) as Record<string | number, number>;
      parent[path.at(-1)!] = parent[path.at(-1)!]! * m.factor;
      continue;
    }
    const paths = pathsOf(body);
    const path = paths[m.pick % paths.length]!;
    if (m.op === 'extra') {
      const target = containerAt(body, path);
      if (target !== null && typeof target === 'object' && !Array.isArray(target)) setOwn(target as Record<string, unknown>, m.key, m.value);
      continue;
    }
    if (path.length === 0) {
      if (m.op === 'set') body = m.value;
      continue;
    }
    const parent = containerAt(body, path.slice(0, -1)) as Record<string | number, unknown> | unknown[];
    const key = path.at(-1)!;
    if (m.op === 'drop') {
      if (Array.isArray(parent)) parent.splice(Number(key), 1);
      else delete parent[key];
    } else setOwn(parent, key, m.value);
  }
  return body;
}

/** JSON text of a valid body with one to three mutations, or a whole-body replacement. */
export function mutatedBody(seed: unknown): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: 6, arbitrary: fc.array(mutation, { minLength: 1, maxLength: 3 }).map((ms) => JSON.stringify(mutate(seed, ms)) ?? 'null') },
    { weight: 1, arbitrary: nastyValue.map((v) => JSON.stringify(v) ?? 'null') },
  );
}

/** Text that is not JSON, or not a JSON object: cut short, trailing junk, single quotes, comments. */
export function malformedJson(seed: unknown): fc.Arbitrary<string> {
  const text = JSON.stringify(seed ?? {});
  return fc.oneof(
    fc.nat({ max: Math.max(text.length - 2, 0) }).map((n) => text.slice(0, n + 1)),
    fc.string({ minLength: 1, maxLength: 6 }).map((junk) => `${text}${junk}}`),
    fc.constantFrom(
      "{'version': 1}",
      '{"a":1,}',
      '{"a":01}',
      '{"a":NaN}',
      '{"a":Infinity}',
      '/* x */ {}',
      '\u00ff\u00fe',
      'undefined',
      '"just a string"',
      '42',
    ),
  );
}

/** Odd content types and encodings for a JSON body (the body itself stays as sent). */
export const bodyHeaders: fc.Arbitrary<Record<string, string>> = fc.record(
  {
    'content-type': fc.constantFrom(
      'application/json',
      'application/json; charset=utf-16',
      'application/json; charset=klingon',
      'text/plain',
      'application/x-www-form-urlencoded',
      'multipart/form-data',
      'multipart/form-data; boundary=x',
      'application/merge-patch+json',
    ),
    'content-encoding': fc.constantFrom('identity', 'gzip', 'deflate', 'br', 'x-unknown'),
  },
  { requiredKeys: ['content-type'] },
);

/** A path parameter no record has: unicode, traversal, percent signs, very long, another shape of id. */
export const nastyParam: fc.Arbitrary<string> = fc.oneof(
  fc.string({ unit: 'grapheme', minLength: 1, maxLength: 40 }).map(encodeURIComponent),
  fc.constantFrom('..%2F..%2Fetc%2Fpasswd', '%00', '%E0%A4%A', '%', '%%', '%ZZ', '__proto__', 'constructor', 'NaN', '-1', '1e309', '%20'),
  fc.integer({ min: 300, max: 6_000 }).map((n) => 'a'.repeat(n)),
  fc.uuid(),
);

/** Cursors a list might be sent: base64url of odd JSON (wrong shapes, huge or negative times), raw junk, very long. */
export const pageCursor: fc.Arbitrary<string> = fc.oneof(
  fc.jsonValue().map((v) => Buffer.from(JSON.stringify(v) ?? 'null').toString('base64url')),
  fc
    .tuple(fc.oneof(fc.integer(), fc.double(), fc.constant(8.64e15 + 1)), fc.string({ maxLength: 120 }))
    .map((t) => Buffer.from(JSON.stringify(t)).toString('base64url')),
  fc.string({ maxLength: 60 }),
  fc.integer({ min: 190, max: 400 }).map((n) => 'A'.repeat(n)),
);

/** `limit=&cursor=` pairs for a paged list, good and bad. */
export const pageQuery: fc.Arbitrary<{ limit?: string; cursor?: string }> = fc.record(
  {
    limit: fc.oneof(fc.integer({ min: -5, max: 400 }).map(String), fc.constantFrom('', 'NaN', '1e309', '2.5', '0x10', ' 7')),
    cursor: pageCursor,
  },
  { requiredKeys: [] },
);

/** A query string of odd keys and values (routes ignore what they do not read). */
export const nastyQuery: fc.Arbitrary<string> = fc
  .array(
    fc.tuple(
      fc.oneof(
        fc.constantFrom('kind', '__proto__', '__proto__[polluted]', 'constructor[prototype][polluted]', 'kind[]', 'version', 'limit', 'cursor', 'limit[]'),
        fc.string({ maxLength: 10 }),
      ),
      fc.oneof(fc.string({ unit: 'grapheme', maxLength: 20 }), fc.constantFrom('yes', 'NaN', '-1', '0', '201', '1e309', '%', '%ZZ'), pageCursor),
    ),
    { minLength: 1, maxLength: 4 },
  )
  .map((pairs) => pairs.map(([k, v]) => `${encodeURIComponent(k)}=${v.startsWith('%') ? v : encodeURIComponent(v)}`).join('&'));

/** What `Object.prototype` and `Array.prototype` hold now, to compare after a call. */
export const prototypeShape = () => JSON.stringify([Object.getOwnPropertyNames(Object.prototype).sort(), Object.getOwnPropertyNames(Array.prototype).sort()]);

/** A payment row as the deposit routes and the webhook write it. */
const storedPayment = zod.object({
  amountCents: zod.number().int().min(0),
  currency: zod.string().regex(/^[a-z]{3}$/),
  state: zod.enum(['open', 'paid', 'expired', 'refund-due', 'refunded']),
  paidAt: zod.date().nullable(),
});

function check(problems: string[], where: string, schemaToUse: z.ZodType, value: unknown) {
  const result = schemaToUse.safeParse(value);
  if (!result.success) problems.push(`${where}: ${result.error.issues.map((i) => `${i.path.join('.')} ${i.message}`).join('; ')}`);
}

/** Every stored row the API writes, checked with the shared schemas the API validates with. Returns what does not parse. */
export function invalidStoredRows(db: Db): string[] {
  const problems: string[] = [];
  for (const s of db.select().from(schema.shops).all()) check(problems, `shop ${s.id}`, shopCreateSchema, { name: s.name, kind: s.kind });
  for (const j of db.select().from(schema.jobs).all()) {
    const { version, vehicle, customerName, complaint, findings, mileage, status } = j;
    check(problems, `job ${j.id}`, jobPatchSchema, { version, vehicle, customerName, complaint, findings, mileage, status });
  }
  for (const e of db.select().from(schema.engines).all()) check(problems, `engine ${e.jobId}`, engineSchema, e.spec);
  for (const p of db.select().from(schema.camProfiles).all()) {
    check(problems, `profile ${p.id}`, profileCreateSchema, { label: p.label, coreNotes: p.coreNotes, spec: p.spec });
  }
  for (const s of db.select().from(schema.specSheets).all()) check(problems, `sheet ${s.id}`, sheetCreateSchema.shape.title, s.title);
  for (const r of db.select().from(schema.sheetRevisions).all()) {
    check(problems, `revision ${r.id} label`, profileLabelSchema, r.label);
    check(problems, `revision ${r.id} spec`, profileSpecSchema, r.spec);
    check(problems, `revision ${r.id} engine`, engineSchema, r.engine);
    check(problems, `revision ${r.id} note`, sheetSaveSchema.shape.note, r.note);
  }
  for (const m of db.select().from(schema.measurements).all()) {
    check(problems, `measurement ${m.id}`, measurementDataSchemas[m.kind], m.data);
    check(problems, `measurement ${m.id} note`, measurementPatchSchema.shape.note, m.note);
  }
  for (const p of db.select().from(schema.photos).all()) {
    check(problems, `photo ${p.id}`, photoPatchSchema, { caption: p.caption, shareable: p.shareable });
    if (!(photoMimeTypes as readonly string[]).includes(p.mimeType)) problems.push(`photo ${p.id}: type ${p.mimeType}`);
  }
  for (const c of db.select().from(schema.checklistItems).all()) check(problems, `checklist item ${c.id}`, checklistAddSchema, { label: c.label });
  for (const s of db.select().from(schema.shopSettings).all())
    check(problems, `limits of ${s.shopId}`, shopLimitsSaveSchema, { version: s.version, limits: s.limits });
  for (const o of db.select().from(schema.grindOrders).all()) {
    check(problems, `order ${o.id} quote`, orderMoveSchema.shape.quote, o.quote ?? undefined);
    check(problems, `order ${o.id} shipping`, orderMoveSchema.shape.shipping, o.shipping ?? undefined);
    if (!(orderStages as readonly string[]).includes(o.stage)) problems.push(`order ${o.id}: stage ${o.stage}`);
  }
  for (const m of db.select().from(schema.orderMessages).all()) check(problems, `message ${m.id}`, messageSchema, { body: m.body });
  for (const p of db.select().from(schema.ownerPages).all())
    check(problems, `owner page ${p.jobId}`, ownerPageSchema, { version: p.version, whatFailed: p.whatFailed });
  for (const o of db.select().from(schema.ownerOptions).all()) {
    const { sheetId, title, ownerNote, priceCents, depositCents, leadTimeDays } = o;
    check(problems, `option ${o.id}`, ownerOptionCreateSchema, { sheetId, title, ownerNote, priceCents, depositCents, leadTimeDays });
  }
  for (const a of db.select().from(schema.ownerApprovals).all()) {
    check(problems, `approval ${a.id}`, approveSchema, {
      optionId: a.optionId,
      checksum: a.checksum,
      offer: a.offerChecksum,
      name: a.approverName,
      agree: true,
    });
  }
  for (const p of db.select().from(schema.payments).all()) {
    check(problems, `payment ${p.id}`, storedPayment, { amountCents: p.amountCents, currency: p.currency, state: p.state, paidAt: p.paidAt });
  }
  return problems;
}

/** What is wrong with an error answer: the one shape, and a 400 names at least one field. */
export function errorShapeProblems(status: number, body: unknown): string[] {
  if (status < 400) return [];
  const error = (body as { error?: { code?: unknown; message?: unknown; fields?: unknown } } | null)?.error;
  if (!error || typeof error.code !== 'string' || typeof error.message !== 'string' || !error.message) {
    return [`${status} without { error: { code, message } }: ${JSON.stringify(body).slice(0, 200)}`];
  }
  if (status !== 400) return [];
  const fields = error.fields;
  if (!fields || typeof fields !== 'object' || Array.isArray(fields)) return [`400 without fields: ${error.message}`];
  const named = Object.entries(fields).filter(([k, v]) => k.trim() !== '' && typeof v === 'string' && v !== '');
  return named.length ? [] : [`400 names no field: ${JSON.stringify(error)}`];
}

/** One part of a multipart upload, described as data so a failing case prints readably. */
export type FilePart = { field: string; name: string; type: string; bytes: Uint8Array<ArrayBuffer> | string };
export type Upload = { files: FilePart[]; fields: [string, string][] };

const nastyFileName = fc.oneof(
  fc.string({ unit: 'grapheme', maxLength: 30 }).map((s) => `${s}.png`),
  fc.constantFrom(
    '../../escape.png',
    '..\\..\\escape.jpg',
    '.png',
    'photo',
    'photo.exe',
    'photo.png.sh',
    '__proto__',
    'constructor.png',
    'x.PNG',
    'lobes.csv',
    'lobes.CSV',
    'lobes.txt',
  ),
  fc.integer({ min: 200, max: 2_000 }).map((n) => `${'n'.repeat(n)}.jpg`),
);
const partField = (expected: string) =>
  fc.oneof({ weight: 4, arbitrary: fc.constant(expected) }, { weight: 1, arbitrary: fc.constantFrom('photo', 'file', 'files[]', ...pollutionKeys) });
const textField = fc.tuple(
  fc.oneof(
    fc.constantFrom('caption', 'note', 'shareable', ...pollutionKeys, '__proto__[polluted]', 'constructor[prototype][polluted]'),
    fc.string({ maxLength: 10 }),
  ),
  fc.oneof(
    fc.string({ unit: 'grapheme', maxLength: 40 }),
    fc.integer({ min: 200, max: 5_000 }).map((n) => 'c'.repeat(n)),
  ),
);
const imageHead = (head: number[]) => {
  const out = new Uint8Array(48);
  out.set(head);
  return out;
};
const imageBytes = fc.oneof(
  fc.constantFrom(
    imageHead([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    imageHead([0xff, 0xd8, 0xff, 0xe0]),
    imageHead([0x52, 0x49, 0x46, 0x46, 0, 0, 0, 0, 0x57, 0x45, 0x42, 0x50]),
  ),
  fc.uint8Array({ maxLength: 64 }).map((b) => new Uint8Array(b)),
  fc.string({ maxLength: 40 }),
);

/** Photo uploads: odd file names, declared types, contents, field names and text fields. */
export const photoUpload: fc.Arbitrary<Upload> = fc.record({
  files: fc.array(
    fc.record({
      field: partField('photos'),
      name: nastyFileName,
      type: fc.constantFrom('image/png', 'image/jpeg', 'image/webp', 'application/octet-stream', 'text/plain', ''),
      bytes: imageBytes,
    }),
    { maxLength: 8 },
  ),
  fields: fc.array(textField, { maxLength: 3 }),
});

const lobeCell = fc.oneof(
  fc.double({ min: -0.5, max: 2, noNaN: true }).map((n) => n.toFixed(4)),
  fc.constantFrom('', ' ', 'NaN', 'Infinity', '-0', '1e309', '0x10', '"0.1"', '0,1', '١٢', '0.1.2'),
  fc.string({ unit: 'grapheme', maxLength: 6 }),
);
const lobeHeader = fc.oneof(
  fc.constantFrom('angle', 'cam_angle', '1I', '1E', '3e', '16I', '17I', '0E', '1X', '', '#', '__proto__'),
  fc.string({ maxLength: 6 }),
);
const lineEnd = fc.constantFrom('\n', '\r\n', '\r');

/** Lobe-table texts: a small valid table with a cell, row or header changed, or a table of odd cells. */
export const lobeCsv: fc.Arbitrary<string> = fc.oneof(
  fc
    .record({ row: fc.nat({ max: 9 }), col: fc.nat({ max: 2 }), cell: fc.oneof(lobeCell, lobeHeader), eol: lineEnd, bom: fc.boolean() })
    .map(({ row, col, cell, eol, bom }) => {
      const rows = lobeTableRows();
      rows[row]![col] = cell;
      return `${bom ? '\uFEFF' : ''}${rows.map((r) => r.join(',')).join(eol)}${eol}`;
    }),
  fc
    .record({
      header: fc.array(lobeHeader, { minLength: 1, maxLength: 6 }),
      rows: fc.array(fc.array(lobeCell, { maxLength: 7 }), { maxLength: 12 }),
      eol: lineEnd,
    })
    .map(({ header, rows, eol }) => [header, ...rows].map((r) => r.join(',')).join(eol)),
);

/** Lobe-table uploads: odd texts or bytes, file names, field names and notes. */
export const lobeUpload: fc.Arbitrary<Upload> = fc.record({
  files: fc.array(
    fc.record({
      field: partField('file'),
      name: fc.oneof({ weight: 3, arbitrary: fc.constant('lobes.csv') }, { weight: 1, arbitrary: nastyFileName }),
      type: fc.constantFrom('text/csv', 'text/plain', 'application/octet-stream', ''),
      bytes: fc.oneof({ weight: 4, arbitrary: lobeCsv }, { weight: 1, arbitrary: fc.uint8Array({ maxLength: 64 }).map((b) => new Uint8Array(b)) }),
    }),
    { maxLength: 3 },
  ),
  fields: fc.array(textField, { maxLength: 3 }),
});

export function toForm(upload: Upload): FormData {
  const form = new FormData();
  for (const f of upload.files) form.append(f.field, new Blob([f.bytes], { type: f.type }), f.name);
  for (const [k, v] of upload.fields) form.append(k, v);
  return form;
}

const isJson = (text: string) => {
  try {
    JSON.parse(text);
    return true;
  } catch {
    return false;
  }
};

/** One delivery to the payment webhook: the body text and its headers. */
export type WebhookCall = {
  body: string;
  headers: Record<string, string>;
  /** Signed with the right secret over exactly this JSON text: the handler reads it. */
  signed: boolean;
};

/**
 * Webhook deliveries for the deposit `sessionId`: the real event mutated, broken JSON or
 * odd text, each signed with the right secret over exactly that text (so the body reaches
 * the handler), with another secret, over other text, unsigned, or with a junk header.
 */
export function webhookCall(sessionId: string, secret: string): fc.Arbitrary<WebhookCall> {
  const seed = paymentEvent(sessionId);
  const body = fc.oneof(
    { weight: 6, arbitrary: mutatedBody(seed) },
    { weight: 2, arbitrary: malformedJson(seed) },
    { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 80 }) },
  );
  const rightly = (b: string) => signWebhook(b, secret);
  const seedText = JSON.stringify(seed);
  const overSeed = () => signWebhook(seedText, secret);
  const signature = fc.oneof(
    { weight: 4, arbitrary: fc.constant(rightly) },
    { weight: 1, arbitrary: fc.constant((b: string) => signWebhook(b, 'whsec_test_someone_else')) },
    { weight: 1, arbitrary: fc.constant(overSeed) },
    { weight: 1, arbitrary: fc.constant(() => undefined) },
    {
      weight: 1,
      arbitrary: fc
        .oneof(fc.constantFrom('', 't=', 'v1=', 't=1,v1=00', 't=NaN,v1=zz', ',,,', 't=1e309'), fc.string({ maxLength: 60 }))
        .map((junk) => () => junk),
    },
  );
  return fc.record({ body, signature, type: fc.option(bodyHeaders.map((h) => h['content-type'])) }).map(({ body: text, signature: sign, type }) => {
    const header = sign(text);
    const headers = { ...(type ? { 'content-type': type } : {}), ...(header !== undefined ? { 'stripe-signature': header } : {}) };
    // The SDK reads the event as JSON once the signature holds; text that is not JSON is refused with the signature.
    return { body: text, headers, signed: isJson(text) && (sign === rightly || (sign === overSeed && text === seedText)) };
  });
}
