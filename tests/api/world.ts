import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import Stripe from 'stripe';

import type { Db } from '@/db';
import {
  Client,
  createTestApp,
  formWith,
  makeEngineSpec,
  makeJobBody,
  makeJobWithEngine,
  makeProfileBody,
  makeShop,
  memberWithRole,
  type TestApp,
} from '@/tests/fixtures';
import { markMailFailedTry, queueMail } from '@/server/store/outbox';

/** Everyone the matrix calls as: nobody, each role of the owning repair shop A and of repair shop B, and two grinding shops. */
export const actors = [
  'anonymous',
  'A.builder',
  'A.tech',
  'A.grinder',
  'A.customer',
  'B.builder',
  'B.tech',
  'B.grinder',
  'B.customer',
  'G1.grinder',
  'G2.grinder',
] as const;
export type Actor = (typeof actors)[number];

/** Shop A's builder and tech: the people who read A's jobs. */
export const shopAReaders: Actor[] = ['A.builder', 'A.tech'];
/** Every role of shop A. */
export const shopAMembers: Actor[] = ['A.builder', 'A.tech', 'A.grinder', 'A.customer'];
/** A's readers and the grinder A's sheet was issued to: who may see what travels with the order. */
const orderReaders: Actor[] = [...shopAReaders, 'G1.grinder'];

/** A distinctive text or id stored for shop A, and who may ever see it in a response. */
export type Marker = {
  text: string;
  what: string;
  readers: Actor[];
  /** Shown on the owner's page to anyone holding its link (and to the owner signed in). */
  onOwnerPage?: boolean;
};

/** Shop A's records (every name and number invented), the other shops, and a signed-in client per actor. */
export type World = {
  t: TestApp;
  as: Record<Actor, Client>;
  a: {
    shopId: string;
    jobId: string;
    jobVersion: number;
    libraryProfileId: string;
    jobProfileId: string;
    /** A job profile with no sheet yet: what the sheet route starts a sheet for (one sheet per profile). */
    spareProfileId: string;
    /** Issued to G1, with an order. */
    sheetId: string;
    sheetVersion: number;
    /** A second sheet, still a draft: what the issue route issues. */
    draftSheetId: string;
    draftSheetVersion: number;
    orderId: string;
    orderVersion: number;
    measurementId: string;
    lobesMeasurementId: string;
    photoId: string;
    checklistItemId: string;
    outboxId: string;
    limitsVersion: number;
    /** The owner's page of the job: its version, one option bound to the issued sheet, a shareable photo. */
    ownerPageVersion: number;
    optionId: string;
    optionVersion: number;
    optionChecksum: string;
    /** The option's offer checksum, as the owner's page shows it. */
    optionOffer: string;
    sharePhotoId: string;
    /** A share link of the job, e-mailed to A's customer; the raw token is only ever shown once, so the world keeps it. */
    shareLinkId: string;
    shareToken: string;
    /** A second job whose owner approved an option and opened a deposit (the deposit routes need an approval). */
    paidJobId: string;
    paidToken: string;
    paidSessionId: string;
    /** A's tech's membership (what the team routes change and remove). */
    techMemberId: string;
    /** An invitation to A that nobody has taken up yet, to an address with no account. */
    pendingInvitationId: string;
    /** An invitation to A sent to B's tech, who opens, accepts or declines it. */
    bTechInvitationId: string;
    /** A mail about A that failed after every try (what its builder sees and sends again). */
    failedMailId: string;
  };
  b: { shopId: string };
  g1: { shopId: string };
  g2: { shopId: string };
  markers: Marker[];
  baseline: { db: string; shopA: string; files: Map<string, Buffer> };
};

const text = {
  vehicle: 'Shop A vehicle: invented three-quarter-ton hauler',
  owner: 'Shop A owner Orrin Halvard',
  complaint: 'Shop A complaint: knock from cylinder 3',
  findings: 'Shop A findings: lifter bore 3E scored',
  coreNotes: 'Shop A core notes: core cracked near journal 2',
  whatFailed: "Shop A owner's words: a lifter stopped rolling",
  option: 'Shop A option: towing regrind',
  optionNote: 'Shop A option note: more pull at low speed',
  sharedCaption: 'Shop A shareable photo caption',
  paidOption: 'Shop A paid option: stock regrind',
  profile: 'Shop A towing grind',
  library: 'Shop A library grind',
  sheet: 'Shop A issued sheet',
  sheetNote: 'Shop A revision note',
  draft: 'Shop A draft sheet',
  orderNote: 'Shop A note to the grinder',
  reply: 'Grinder G1 reply to shop A',
  measurement: 'Shop A measurement note',
  lobes: 'Shop A lobe table note',
  caption: 'Shop A photo caption',
  photoName: 'shop-a-lifter.png',
  checklist: 'Shop A checklist item',
  limits: 'Shop A limit source',
  shop: 'Test Shop A',
};

/** Shop A's internal texts: never on the owner's page, whoever opens it. */
export const internalTexts = [
  text.findings,
  text.complaint,
  text.sheetNote,
  text.coreNotes,
  text.orderNote,
  text.reply,
  text.measurement,
  text.lobes,
  text.caption,
];

/** A `checkout.session.completed` event for `sessionId`, as the payment service sends it, with `change` applied. */
export const paymentEvent = (sessionId: string, change: Record<string, unknown> = {}) => ({
  id: `evt_test_${sessionId}`,
  object: 'event',
  type: 'checkout.session.completed',
  data: { object: { id: sessionId, object: 'checkout.session', payment_status: 'paid', amount_total: 20_000, currency: 'usd' } },
  ...change,
});

const signer = new Stripe('sk_test_signing_only');
/** The signature header the payment service sends with `payload`, signed with `secret` (the app's is `t.payments.webhookSecret`). */
export const signWebhook = (payload: string, secret: string) => signer.webhooks.generateTestHeaderString({ payload, secret });

/** The PNG signature and an IHDR start: enough for the server's content check. */
export const PNG = (() => {
  const out = new Uint8Array(64);
  out.set([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d]);
  return out;
})();

/** A small lobe table (invented readings): crank angle and two lobes, nine rows. */
export const lobeTableRows = (): string[][] => [
  ['angle', '1I', '1E'],
  ...Array.from({ length: 9 }, (_, i) => [String(-40 + 10 * i), (0.07 * (4 - Math.abs(4 - i))).toFixed(3), (0.068 * (4 - Math.abs(4 - i))).toFixed(3)]),
];
export const lobeCsvText = () =>
  `${lobeTableRows()
    .map((r) => r.join(','))
    .join('\n')}\n`;

function expectStatus(res: { status: number; body: unknown }, status: number, what: string) {
  if (res.status !== status) throw new Error(`${what}: ${res.status} ${JSON.stringify(res.body)}`);
}

/** Builds the shops, people and records once; every matrix or fuzz call then starts from this state. */
export async function buildWorld(): Promise<World> {
  // The share pages' per-address limit would refuse the suites' many calls from one address.
  const t = await createTestApp({
    devTools: true,
    calcRateLimit: { limit: 100_000, windowMs: 60_000 },
    shareRateLimit: { limit: 1_000_000, windowMs: 60_000 },
  });
  const a = await makeJobWithEngine(t, text.shop);
  const builder = a.founder;
  const [aTech, aGrinder, aCustomer] = [
    await memberWithRole(t, a.shopId, 'tech'),
    await memberWithRole(t, a.shopId, 'grinder'),
    await memberWithRole(t, a.shopId, 'customer'),
  ];
  const b = await makeShop(t, 'repair', 'Test Shop B');
  const [bTech, bGrinder, bCustomer] = [
    await memberWithRole(t, b.shopId, 'tech'),
    await memberWithRole(t, b.shopId, 'grinder'),
    await memberWithRole(t, b.shopId, 'customer'),
  ];
  const g1 = await makeShop(t, 'grinding', 'Test Grinding G1');
  const g2 = await makeShop(t, 'grinding', 'Test Grinding G2');

  const job = await builder.patch(`/api/jobs/${a.jobId}`, {
    version: 1,
    vehicle: text.vehicle,
    customerName: text.owner,
    complaint: text.complaint,
    findings: text.findings,
  });
  expectStatus(job, 200, 'job');
  const profile = await builder.patch(`/api/profiles/${a.profileId}`, { version: 1, label: text.profile, coreNotes: text.coreNotes });
  expectStatus(profile, 200, 'job profile');
  const library = await builder.post('/api/profiles', makeProfileBody({ label: text.library }));
  expectStatus(library, 201, 'library profile');

  const sheet = await builder.post(`/api/jobs/${a.jobId}/sheets`, { title: text.sheet, profileId: a.profileId, note: text.sheetNote });
  expectStatus(sheet, 201, 'sheet');
  const issue = await builder.post(`/api/sheets/${sheet.body.sheet.id}/issue`, {
    version: sheet.body.sheet.version,
    grinderShopId: g1.shopId,
    note: text.orderNote,
  });
  expectStatus(issue, 201, 'issue');
  const orderId = issue.body.order.id as string;
  expectStatus(await g1.founder.post(`/api/orders/${orderId}/messages`, { body: text.reply }), 201, 'reply');
  // Each sheet grinds its own profile: the draft sheet has a second one, and a third is left without a sheet.
  const draftProfile = await builder.post(`/api/jobs/${a.jobId}/profiles`, makeProfileBody({ label: 'Test draft option' }));
  expectStatus(draftProfile, 201, 'draft option profile');
  const spareProfile = await builder.post(`/api/jobs/${a.jobId}/profiles`, makeProfileBody({ label: 'Test spare option' }));
  expectStatus(spareProfile, 201, 'spare option profile');
  const draft = await builder.post(`/api/jobs/${a.jobId}/sheets`, { title: text.draft, profileId: draftProfile.body.profile.id });
  expectStatus(draft, 201, 'draft sheet');

  const measurement = await aTech.post(`/api/jobs/${a.jobId}/measurements`, {
    kind: 'ptv-baseline',
    note: text.measurement,
    data: { method: 'clay', intake: [{ crankAngle: -10, clearance: 0.22 }], exhaust: [{ crankAngle: 10, clearance: 0.2 }] },
  });
  expectStatus(measurement, 201, 'measurement');
  const lobes = await aTech.upload(
    `/api/jobs/${a.jobId}/measurements/lobes`,
    formWith([['file', 'lobes.csv', lobeCsvText(), 'text/csv']], { note: text.lobes }),
  );
  expectStatus(lobes, 201, 'lobe table');
  const photo = await aTech.upload(`/api/jobs/${a.jobId}/photos`, formWith([['photos', text.photoName, PNG, 'image/png']], { caption: text.caption }));
  expectStatus(photo, 201, 'photo');
  expectStatus(await aTech.get(`/api/jobs/${a.jobId}/checklist`), 200, 'checklist');
  const item = await aTech.post(`/api/jobs/${a.jobId}/checklist`, { label: text.checklist });
  expectStatus(item, 201, 'checklist item');
  expectStatus(await aTech.post(`/api/sheets/${sheet.body.sheet.id}/fit-checks`), 201, 'fit checks');
  const limits = await builder.put('/api/shop/limits', { version: 0, limits: { coilBind: { min: 0.06, source: text.limits } } });
  expectStatus(limits, 200, 'limits');
  const owner = await ownerPage(builder, aCustomer, a.jobId, sheet.body.sheet.id as string, aTech);
  const paid = await paidJob(builder, aCustomer);
  const outbox = await builder.get('/api/dev/outbox');
  expectStatus(outbox, 200, 'outbox');
  const team = await teamOf(builder, bTech);
  const failedMailId = queueMail(t.db, { to: aCustomer.email, subject: 'Undelivered test mail', text: 'Plain', html: '<p>Marked</p>' }, 'pending', a.shopId);
  markMailFailedTry(t.db, failedMailId, '550 mailbox unavailable', null);

  const ids = {
    shopId: a.shopId,
    jobId: a.jobId,
    jobVersion: job.body.job.version as number,
    libraryProfileId: library.body.profile.id as string,
    jobProfileId: a.profileId,
    spareProfileId: spareProfile.body.profile.id as string,
    sheetId: sheet.body.sheet.id as string,
    sheetVersion: (sheet.body.sheet.version as number) + 1,
    draftSheetId: draft.body.sheet.id as string,
    draftSheetVersion: draft.body.sheet.version as number,
    orderId,
    orderVersion: issue.body.order.version as number,
    measurementId: measurement.body.measurement.id as string,
    lobesMeasurementId: lobes.body.measurement.id as string,
    photoId: photo.body.photos[0].id as string,
    checklistItemId: item.body.item.id as string,
    outboxId: outbox.body.messages[0].id as string,
    limitsVersion: limits.body.version as number,
    ...owner,
    ...paid,
    ...team,
    failedMailId,
  };

  const markers: Marker[] = [
    // The owner signed in finds their jobs by id under /api/my/jobs.
    { what: "shop A's job id", text: ids.jobId, readers: [...shopAReaders, 'A.customer'] },
    { what: "the paid job's id", text: ids.paidJobId, readers: [...shopAReaders, 'A.customer'] },
    { what: "the job's vehicle", text: text.vehicle, readers: orderReaders, onOwnerPage: true },
    { what: "the job's owner", text: text.owner, readers: shopAReaders, onOwnerPage: true },
    { what: "the job's complaint", text: text.complaint, readers: shopAReaders },
    { what: "the job's findings", text: text.findings, readers: shopAReaders },
    { what: "the job profile's label", text: text.profile, readers: orderReaders },
    // Core notes go to the grinder with the issued revision (never to the owner).
    { what: "the job profile's core notes", text: text.coreNotes, readers: orderReaders },
    { what: "the owner's words", text: text.whatFailed, readers: shopAReaders, onOwnerPage: true },
    { what: "an option's title", text: text.option, readers: shopAReaders, onOwnerPage: true },
    { what: "an option's note for the owner", text: text.optionNote, readers: shopAReaders, onOwnerPage: true },
    { what: "an option's id", text: ids.optionId, readers: shopAReaders, onOwnerPage: true },
    { what: "the paid job's option", text: text.paidOption, readers: shopAReaders, onOwnerPage: true },
    { what: "a share link's id", text: ids.shareLinkId, readers: shopAReaders },
    // The token only comes back inside the owner's page (its photo addresses).
    { what: 'the share token', text: ids.shareToken, readers: [], onOwnerPage: true },
    { what: "a shareable photo's caption", text: text.sharedCaption, readers: shopAReaders, onOwnerPage: true },
    { what: "a shareable photo's id", text: ids.sharePhotoId, readers: shopAReaders, onOwnerPage: true },
    { what: 'the library profile', text: text.library, readers: shopAReaders },
    { what: "the library profile's id", text: ids.libraryProfileId, readers: shopAReaders },
    { what: "the issued sheet's title", text: text.sheet, readers: orderReaders },
    { what: "the issued sheet's id", text: ids.sheetId, readers: orderReaders },
    { what: "the issued revision's note", text: text.sheetNote, readers: orderReaders },
    { what: 'the draft sheet', text: text.draft, readers: shopAReaders },
    { what: "the draft sheet's id", text: ids.draftSheetId, readers: shopAReaders },
    { what: "the order's id", text: orderId, readers: orderReaders },
    { what: "the builder's note on the order", text: text.orderNote, readers: orderReaders },
    { what: "the grinder's reply", text: text.reply, readers: orderReaders },
    { what: 'a measurement note', text: text.measurement, readers: shopAReaders },
    { what: "a measurement's id", text: ids.measurementId, readers: shopAReaders },
    { what: "the lobe table's note", text: text.lobes, readers: shopAReaders },
    { what: "a photo's caption", text: text.caption, readers: shopAReaders },
    { what: "a photo's file name", text: text.photoName, readers: shopAReaders },
    { what: "a photo's id", text: ids.photoId, readers: shopAReaders },
    { what: 'a checklist item', text: text.checklist, readers: shopAReaders },
    { what: "a checklist item's id", text: ids.checklistItemId, readers: shopAReaders },
    { what: "the shop's limit source", text: text.limits, readers: shopAReaders },
    { what: "shop A's name", text: text.shop, readers: [...shopAMembers, 'G1.grinder'], onOwnerPage: true },
    { what: "shop A's id", text: a.shopId, readers: [...shopAMembers, 'G1.grinder'] },
  ];

  const world: World = {
    t,
    as: {
      anonymous: new Client(t.url),
      'A.builder': builder,
      'A.tech': aTech,
      'A.grinder': aGrinder,
      'A.customer': aCustomer,
      'B.builder': b.founder,
      'B.tech': bTech,
      'B.grinder': bGrinder,
      'B.customer': bCustomer,
      'G1.grinder': g1.founder,
      'G2.grinder': g2.founder,
    },
    a: ids,
    b: { shopId: b.shopId },
    g1: { shopId: g1.shopId },
    g2: { shopId: g2.shopId },
    markers,
    baseline: { db: '', shopA: '', files: new Map() },
  };
  world.baseline = { db: dbFingerprint(t.db), shopA: shopFingerprint(t.db, a.shopId), files: readFiles(t.uploadsDir) };
  return world;
}

/**
 * The owner's page of A's job: the owner's words, one option bound to the issued
 * sheet, a shareable photo, and a share link e-mailed to A's customer. Nothing approved yet.
 */
async function ownerPage(builder: Client, customer: { email: string }, jobId: string, sheetId: string, tech: Client) {
  const page = await builder.put(`/api/jobs/${jobId}/owner`, { version: 0, whatFailed: text.whatFailed });
  expectStatus(page, 200, "owner's page");
  const option = await builder.post(`/api/jobs/${jobId}/owner/options`, {
    sheetId,
    title: text.option,
    ownerNote: text.optionNote,
    priceCents: 76_000,
    depositCents: 22_500,
    leadTimeDays: 8,
  });
  expectStatus(option, 201, 'option');
  const photo = await tech.upload(`/api/jobs/${jobId}/photos`, formWith([['photos', 'shared.png', PNG, 'image/png']], { caption: text.sharedCaption }));
  expectStatus(photo, 201, 'shareable photo');
  const sharePhotoId = photo.body.photos[0].id as string;
  expectStatus(await tech.patch(`/api/photos/${sharePhotoId}`, { shareable: true }), 200, 'photo shared');
  const link = await builder.post(`/api/jobs/${jobId}/share-links`, { email: customer.email });
  expectStatus(link, 201, 'share link');
  const first = option.body.desk.options[0];
  const shown = (await new Client(builder.baseUrl).get(`/api/share/${link.body.token}`)).body.view.options[0];
  return {
    ownerPageVersion: page.body.desk.version as number,
    optionId: first.id as string,
    optionVersion: first.version as number,
    optionChecksum: first.checksum as string,
    optionOffer: shown.offer as string,
    sharePhotoId,
    shareLinkId: link.body.link.id as string,
    shareToken: link.body.token as string,
  };
}

/** A second job of shop A whose owner approved its option through a link (e-mailed to A's customer) and opened a deposit. */
async function paidJob(builder: Client, customer: { email: string }) {
  const job = await builder.post('/api/jobs', makeJobBody());
  expectStatus(job, 201, 'paid job');
  const jobId = job.body.job.id as string;
  expectStatus(await builder.put(`/api/jobs/${jobId}/engine`, { version: 0, engine: makeEngineSpec() }), 201, 'paid job engine');
  const profile = await builder.post(`/api/jobs/${jobId}/profiles`, makeProfileBody());
  expectStatus(profile, 201, 'paid job profile');
  const sheet = await builder.post(`/api/jobs/${jobId}/sheets`, { title: 'Test paid sheet', profileId: profile.body.profile.id });
  expectStatus(sheet, 201, 'paid job sheet');
  const option = await builder.post(`/api/jobs/${jobId}/owner/options`, {
    sheetId: sheet.body.sheet.id,
    title: text.paidOption,
    priceCents: 60_000,
    depositCents: 20_000,
    leadTimeDays: 5,
  });
  expectStatus(option, 201, 'paid job option');
  const link = await builder.post(`/api/jobs/${jobId}/share-links`, { email: customer.email });
  expectStatus(link, 201, 'paid job link');
  const token = link.body.token as string;
  const { id, checksum, offer } = (await new Client(builder.baseUrl).get(`/api/share/${token}`)).body.view.options[0];
  expectStatus(
    await new Client(builder.baseUrl).post(`/api/share/${token}/approve`, { optionId: id, checksum, offer, name: 'Test Owner', agree: true }),
    201,
    'approval',
  );
  const deposit = await new Client(builder.baseUrl).post(`/api/share/${token}/deposit`);
  expectStatus(deposit, 201, 'deposit');
  return { paidJobId: jobId, paidToken: token, paidSessionId: new URL(deposit.body.url as string).pathname.split('/').pop()! };
}

/** Shop A's team: the tech's membership and two open invitations, one to an address nobody holds and one to B's tech. */
async function teamOf(builder: Client, bTech: { email: string }) {
  const team = await builder.get('/api/shop/team');
  expectStatus(team, 200, 'team');
  const pending = await builder.post('/api/shop/invitations', { email: `pending-${Date.now()}@example.test`, role: 'tech' });
  expectStatus(pending, 201, 'pending invitation');
  const toBTech = await builder.post('/api/shop/invitations', { email: bTech.email, role: 'tech' });
  expectStatus(toBTech, 201, "B's tech invitation");
  const invitationFor = (email: string) => (toBTech.body.invitations as { id: string; email: string }[]).find((i) => i.email === email)!.id;
  return {
    techMemberId: (team.body.members as { id: string; role: string }[]).find((m) => m.role === 'tech')!.id,
    pendingInvitationId: (pending.body.invitations as { id: string }[])[0]!.id,
    bTechInvitationId: invitationFor(bTech.email),
  };
}

const quote = (name: string) => `"${name.replace(/"/g, '""')}"`;

/**
 * Counters, not records: every request a rate limit sees bumps a row here, a refused one included, so
 * "changed nothing" is judged without them. The limits have tests of their own (server/store/rate-limits.test.ts,
 * tests/workers.test.ts).
 */
const COUNTER_TABLES = new Set(['rate_limit_hits', 'auth_rate_limits']);

function tableNames(db: Db): string[] {
  return (db.$client.prepare("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by name").all() as { name: string }[])
    .map((r) => r.name)
    .filter((name) => !COUNTER_TABLES.has(name));
}

function hashRows(db: Db, sql: string, params: unknown[] = []): string {
  return createHash('sha256')
    .update(
      JSON.stringify(
        db.$client
          .prepare(sql)
          .raw()
          .all(...params),
      ),
    )
    .digest('hex');
}

/** A hash over every row of every table. */
export function dbFingerprint(db: Db): string {
  return tableNames(db)
    .map((table) => `${table}:${hashRows(db, `select * from ${quote(table)} order by rowid`)}`)
    .join('\n');
}

/** How a row belongs to a shop, by column name. */
const ownerFilters: Record<string, string> = {
  shop_id: 'shop_id = ?',
  repair_shop_id: 'repair_shop_id = ?',
  sheet_id: 'sheet_id in (select id from spec_sheets where shop_id = ?)',
  order_id: 'order_id in (select id from grind_orders where repair_shop_id = ?)',
};

/** A hash over the rows that belong to `shopId` (its own row, and every row that names it or its sheets and orders). */
export function shopFingerprint(db: Db, shopId: string): string {
  return tableNames(db)
    .flatMap((table) => {
      const columns = (db.$client.prepare(`pragma table_info(${quote(table)})`).all() as { name: string }[]).map((c) => c.name);
      const filters = table === 'shops' ? ['id = ?'] : columns.flatMap((c) => (ownerFilters[c] ? [ownerFilters[c]] : []));
      if (!filters.length) return [];
      const sql = `select * from ${quote(table)} where ${filters.join(' or ')} order by rowid`;
      return [
        `${table}:${hashRows(
          db,
          sql,
          filters.map(() => shopId),
        )}`,
      ];
    })
    .join('\n');
}

/** Every file under the uploads folder, by relative path. */
export function readFiles(dir: string): Map<string, Buffer> {
  const out = new Map<string, Buffer>();
  if (!fs.existsSync(dir)) return out;
  for (const entry of fs.readdirSync(dir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile()) continue;
    const full = path.join(entry.parentPath, entry.name);
    out.set(path.relative(dir, full), fs.readFileSync(full));
  }
  return out;
}

/** Files added, removed or changed against `before`. */
export function filesChanged(before: Map<string, Buffer>, dir: string): string[] {
  const now = readFiles(dir);
  const changed = [...now.keys()].filter((f) => !before.get(f)?.equals(now.get(f)!));
  return [...changed, ...[...before.keys()].filter((f) => !now.has(f))];
}

/** What a probe can tell about the state a call left behind, before it is undone. */
export type Probe = {
  dbChanged: () => boolean;
  shopAChanged: () => boolean;
  filesChanged: () => string[];
};

/**
 * Runs `fn` inside one outer transaction and undoes it afterwards, so every call
 * starts from the world's baseline. The routes' own transactions nest as savepoints
 * (better-sqlite3 does this when a transaction is already open); uploaded or
 * removed files are put back as they were.
 */
export async function isolated<T>(w: World, fn: (probe: Probe) => Promise<T>): Promise<T> {
  const { db, uploadsDir } = w.t;
  db.$client.exec('BEGIN');
  // A call that wrote no row cannot have changed anything: skip the hashing then.
  const writes = () => (db.$client.prepare('select total_changes() as n').get() as { n: number }).n;
  const writesBefore = writes();
  try {
    return await fn({
      dbChanged: () => writes() !== writesBefore && dbFingerprint(db) !== w.baseline.db,
      shopAChanged: () => shopFingerprint(db, w.a.shopId) !== w.baseline.shopA,
      filesChanged: () => filesChanged(w.baseline.files, uploadsDir),
    });
  } finally {
    if (db.$client.inTransaction) db.$client.exec('ROLLBACK');
    restoreFiles(w);
  }
}

function restoreFiles(w: World) {
  const dir = w.t.uploadsDir;
  for (const file of readFiles(dir).keys()) if (!w.baseline.files.has(file)) fs.rmSync(path.join(dir, file));
  for (const [file, bytes] of w.baseline.files) {
    const full = path.join(dir, file);
    if (!fs.existsSync(full) || !fs.readFileSync(full).equals(bytes)) {
      fs.mkdirSync(path.dirname(full), { recursive: true });
      fs.writeFileSync(full, bytes);
    }
  }
}
