import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { demoAccounts, demoJobId, demoPassword, demoSheetId, seedDemo } from '@/db/seed';
import { revisionChecksum } from '@/shared/checksum';
import { orderMoves, orderStages, type OrderStage } from '@/shared/orders';
import { Client, createTestApp, makeJobWithEngine, makeProfileBody, makeProfileSpec, makeShop, memberWithRole, signUp, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** Order mail to the address (the sign-up's verification mail left out). */
function outboxTo(email: string) {
  return t.db
    .select()
    .from(schema.outbox)
    .all()
    .filter((m) => m.to === email && !/verify your e-mail/i.test(m.subject));
}

/** A repair shop with a draft sheet, and a grinding shop with a grinder (the founder is the grinder too). */
async function setup(name = 'Order shop') {
  const repair = await makeJobWithEngine(t, `${name} repair`);
  const builder = repair.founder;
  const sheet = (await builder.post(`/api/jobs/${repair.jobId}/sheets`, { title: `${name} regrind`, profileId: repair.profileId })).body.sheet;
  const grinding = await makeShop(t, 'grinding', `${name} grinding`);
  const grinder = await memberWithRole(t, grinding.shopId, 'grinder');
  return { ...repair, builder, sheet, grinderShopId: grinding.shopId, grinderFounder: grinding.founder, grinder };
}

/** The reason the tests give for a firm order without the owner's approval (invented). */
const fleetReason = { reason: 'Fleet account: the fleet manager signs off by phone' };

/** A sheet issued as a firm order the builder confirmed (the shop skips the owner step), ready to quote and grind. */
async function issued(name?: string) {
  const s = await setup(name);
  const res = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, {
    version: s.sheet.version,
    grinderShopId: s.grinderShopId,
    note: 'Grind on our core',
    confirm: fleetReason,
  });
  expect(res.status).toBe(201);
  return { ...s, order: res.body.order };
}

describe('issuing a sheet to a grinder', { timeout: 30_000 }, () => {
  it('lists grinding shops for a builder, and not for a grinder', async () => {
    const s = await setup('Listing');
    const res = await s.builder.get('/api/grinding-shops');
    expect(res.status).toBe(200);
    expect(res.body.shops).toContainEqual({ id: s.grinderShopId, name: 'Listing grinding' });
    expect(res.body.shops.map((x: { id: string }) => x.id)).not.toContain(s.shopId);
    expect((await s.grinder.get('/api/grinding-shops')).status).toBe(403);
  });

  it('freezes the revision: it is issued with a checksum, a later edit writes revision 2 and leaves it as it was', async () => {
    const s = await setup('Freeze');
    const res = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 1, grinderShopId: s.grinderShopId });
    expect(res.status).toBe(201);
    const order = res.body.order;
    expect(order).toMatchObject({
      sheetId: s.sheet.id,
      revisionId: s.sheet.current.id,
      revisionNumber: 1,
      stage: 'sent',
      quote: null,
      shipping: null,
      version: 1,
      repairShop: { id: s.shopId, name: 'Freeze repair' },
      grinderShop: { id: s.grinderShopId, name: 'Freeze grinding' },
    });
    const before = t.db.$client.prepare('select * from sheet_revisions where id = ?').get(s.sheet.current.id) as Record<string, unknown>;
    expect(before).toMatchObject({ state: 'issued', issued_to_shop_id: s.grinderShopId });
    expect(order.checksum).toBe(revisionChecksum(s.sheet.current));
    expect(order.issuedAt).toBe(new Date(before.issued_at as number).toISOString());

    const sheetNow = (await s.builder.get(`/api/sheets/${s.sheet.id}`)).body.sheet;
    expect(sheetNow.version).toBe(2);
    // Issuing the same (issued) revision again is refused.
    const again = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 2, grinderShopId: s.grinderShopId });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already issued — edit/);

    const spec = makeProfileSpec({ intake: { ...makeProfileSpec().intake, duration050: 214 } });
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: 2, spec });
    expect(edited.status).toBe(200);
    expect(edited.body.sheet.current).toMatchObject({ number: 2, state: 'draft' });
    expect(t.db.$client.prepare('select * from sheet_revisions where id = ?').get(s.sheet.current.id)).toEqual(before);

    // The grinder still sees revision 1 exactly as issued.
    const seen = await s.grinder.get(`/api/orders/${order.id}`);
    expect(seen.body.order.revision.spec).toEqual(s.sheet.current.spec);
    expect(seen.body.order.revision.number).toBe(1);

    // Revision 2 can be issued as its own order with a different checksum.
    const second = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 3, grinderShopId: s.grinderShopId });
    expect(second.status).toBe(201);
    expect(second.body.order.revisionNumber).toBe(2);
    expect(second.body.order.checksum).not.toBe(order.checksum);
    const list = await s.builder.get(`/api/sheets/${s.sheet.id}/orders`);
    expect(list.body.orders.map((o: { revisionNumber: number }) => o.revisionNumber)).toEqual([2, 1]);
  });

  it('guards the sheet version, the target shop and the role', async () => {
    const s = await setup('Guards');
    const stale = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 7, grinderShopId: s.grinderShopId });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/Reload/);
    const toRepair = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 1, grinderShopId: s.shopId });
    expect(toRepair.status).toBe(400);
    expect(toRepair.body.error.fields).toHaveProperty('grinderShopId');
    const missing = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 1 });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toHaveProperty('grinderShopId');
    const tech = await memberWithRole(t, s.shopId, 'tech');
    expect((await tech.post(`/api/sheets/${s.sheet.id}/issue`, { version: 1, grinderShopId: s.grinderShopId })).status).toBe(403);
    const other = await makeJobWithEngine(t, 'Guards other');
    expect((await other.founder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 1, grinderShopId: s.grinderShopId })).status).toBe(404);
    // Nothing was issued by the refused requests.
    const rev = t.db.$client.prepare('select state from sheet_revisions where id = ?').get(s.sheet.current.id);
    expect(rev).toEqual({ state: 'draft' });
    expect((await s.builder.get(`/api/sheets/${s.sheet.id}/orders`)).body.orders).toEqual([]);
  });
});

describe('who sees an order', { timeout: 30_000 }, () => {
  it('shows each grinding shop only its own orders, never drafts, and hides orders from everyone outside', async () => {
    const a = await issued('Seen A');
    const b = await issued('Seen B');
    // A draft sheet in A's repair shop, never issued (a second option: each sheet grinds its own profile).
    const second = (await a.builder.post(`/api/jobs/${a.jobId}/profiles`, makeProfileBody({ label: 'Second option' }))).body.profile;
    const draft = (await a.builder.post(`/api/jobs/${a.jobId}/sheets`, { title: 'Still a draft', profileId: second.id })).body.sheet;

    const incomingA = await a.grinder.get('/api/incoming');
    expect(incomingA.status).toBe(200);
    expect(incomingA.body.orders.map((o: { id: string }) => o.id)).toEqual([a.order.id]);
    expect(JSON.stringify(incomingA.body)).not.toContain(draft.id);
    expect((await b.grinder.get('/api/incoming')).body.orders.map((o: { id: string }) => o.id)).toEqual([b.order.id]);

    expect((await a.grinder.get(`/api/orders/${b.order.id}`)).status).toBe(404);
    expect((await b.grinder.get(`/api/orders/${a.order.id}`)).status).toBe(404);
    expect((await b.builder.get(`/api/orders/${a.order.id}`)).status).toBe(404);
    expect((await b.builder.get(`/api/sheets/${a.sheet.id}/orders`)).status).toBe(404);
    const stranger = await signUp(t, 'Stranger');
    expect((await stranger.get(`/api/orders/${a.order.id}`)).status).toBe(403);
    const customer = await memberWithRole(t, a.shopId, 'customer');
    expect((await customer.get(`/api/orders/${a.order.id}`)).status).toBe(404);
    expect((await a.builder.get('/api/incoming')).status).toBe(403);

    const detail = await a.grinder.get(`/api/orders/${a.order.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.order).toMatchObject({ id: a.order.id, stage: 'sent', vehicle: 'Test one-ton flatbed, 5.9 L pushrod V8' });
    expect(JSON.stringify(detail.body)).not.toContain('Test Owner');
    expect(detail.body.order.revision).toMatchObject({ state: 'issued', number: 1 });
    expect(detail.body.order.messages).toMatchObject([{ body: 'Grind on our core', author: { side: 'builder', shopName: 'Seen A repair' } }]);
    expect(detail.body.order.events).toMatchObject([{ action: 'issue', detail: { to: 'sent' } }]);
    const tech = await memberWithRole(t, a.shopId, 'tech');
    expect((await tech.get(`/api/orders/${a.order.id}`)).status).toBe(200);
  });
});

/** Walks an order to `stage` along the legal path. */
const pathTo: Record<OrderStage, OrderStage[]> = {
  sent: [],
  quoted: ['quoted'],
  'changes-asked': ['changes-asked'],
  grinding: ['quoted', 'grinding'],
  shipped: ['quoted', 'grinding', 'shipped'],
  received: ['quoted', 'grinding', 'shipped', 'received'],
  installed: ['quoted', 'grinding', 'shipped', 'received', 'installed'],
};

/** What a move needs besides `to`. */
function extras(to: OrderStage) {
  return {
    ...(to === 'quoted' ? { quote: { priceCents: 48500, leadTimeDays: 6 } } : {}),
    ...(to === 'changes-asked' ? { message: 'Base circle note is missing' } : {}),
    ...(to === 'shipped' ? { shipping: { carrier: 'Test freight', tracking: 'TRK-0001' } } : {}),
  };
}

describe('moving an order', { timeout: 30_000 }, () => {
  it('takes the demo path from sent to installed, storing the quote and the shipping, with each move in the events', async () => {
    const s = await issued('Path');
    let version = 1;
    for (const to of pathTo.installed) {
      const by = orderMoves[orderStages.find((st) => orderMoves[st].some((m) => m.to === to))!].find((m) => m.to === to)!.by;
      const who = by === 'grinder' ? s.grinder : s.builder;
      const res = await who.post(`/api/orders/${s.order.id}/move`, { version, to, ...extras(to) });
      expect(res.status, `${to}: ${JSON.stringify(res.body)}`).toBe(200);
      expect(res.body.order).toMatchObject({ stage: to, version: version + 1 });
      version += 1;
    }
    const detail = (await s.builder.get(`/api/orders/${s.order.id}`)).body.order;
    expect(detail.quote).toEqual({ priceCents: 48500, leadTimeDays: 6 });
    expect(detail.shipping).toEqual({ carrier: 'Test freight', tracking: 'TRK-0001' });
    expect(detail.events.map((e: { action: string; detail: { to: string } }) => `${e.action}:${e.detail.to}`)).toEqual([
      'issue:sent',
      ...pathTo.installed.map((to) => `move:${to}`),
    ]);
  });

  it('answers every illegal move with a 409 that names the stage and the allowed moves', async () => {
    const s = await issued('Illegal');
    const sides = { grinder: s.grinder, builder: s.builder } as const;
    // One order per starting stage, walked there along the legal path.
    for (const from of orderStages) {
      let order = s.order;
      if (from !== 'sent') {
        const fresh = await setupOrderAt(from);
        order = fresh.order;
        Object.assign(sides, { grinder: fresh.grinder, builder: fresh.builder });
      }
      for (const to of orderStages) {
        for (const side of ['grinder', 'builder'] as const) {
          const legal = orderMoves[from].some((m) => m.to === to && m.by === side);
          if (legal) continue;
          const res = await sides[side].post(`/api/orders/${order.id}/move`, { version: order.version, to, ...extras(to) });
          expect(res.status, `${side} ${from} → ${to}`).toBe(409);
          expect(res.body.error.code).toBe('illegal_move');
          expect(res.body.error.message).toContain(`This order is ${from}`);
          for (const m of orderMoves[from]) expect(res.body.error.message).toContain(`the ${m.by} can move it to ${m.to}`);
        }
      }
      const after = await sides.builder.get(`/api/orders/${order.id}`);
      expect(after.body.order).toMatchObject({ stage: from, version: order.version });
    }
  }, 90_000);

  it('asks for the quote, the message or the shipping a move needs (400 naming the field), and refuses fields of other moves', async () => {
    const s = await issued('Fields');
    const noQuote = await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'quoted' });
    expect(noQuote.status).toBe(400);
    expect(noQuote.body.error.fields).toHaveProperty('quote');
    const noMessage = await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'changes-asked' });
    expect(noMessage.status).toBe(400);
    expect(noMessage.body.error.fields).toHaveProperty('message');
    const wrongField = await s.grinder.post(`/api/orders/${s.order.id}/move`, {
      version: 1,
      to: 'quoted',
      ...extras('quoted'),
      shipping: extras('shipped').shipping,
    });
    expect(wrongField.status).toBe(400);
    expect(wrongField.body.error.fields).toHaveProperty('shipping');
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') });
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 2, to: 'grinding' });
    const noShipping = await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 3, to: 'shipped' });
    expect(noShipping.status).toBe(400);
    expect(noShipping.body.error.fields).toHaveProperty('shipping');
    expect((await s.builder.get(`/api/orders/${s.order.id}`)).body.order.stage).toBe('grinding');
  });

  it('guards the version, and lets only a builder or the grinder move', async () => {
    const s = await issued('Version');
    const stale = await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 5, to: 'quoted', ...extras('quoted') });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/Reload/);
    const ok = await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') });
    expect(ok.status).toBe(200);
    const twice = await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'grinding' });
    expect(twice.status).toBe(409);
    const tech = await memberWithRole(t, s.shopId, 'tech');
    expect((await tech.post(`/api/orders/${s.order.id}/move`, { version: 2, to: 'grinding' })).status).toBe(403);
    const outsider = await issued('Version outsider');
    expect((await outsider.grinder.post(`/api/orders/${s.order.id}/move`, { version: 2, to: 'grinding' })).status).toBe(404);
    expect((await s.builder.get(`/api/orders/${s.order.id}`)).body.order).toMatchObject({ stage: 'quoted', version: 2 });
  });
});

/** A new issued order walked to `stage`. */
async function setupOrderAt(stage: OrderStage) {
  const s = await issued(`At ${stage}`);
  let order = s.order;
  for (const to of pathTo[stage]) {
    const by = Object.values(orderMoves)
      .flat()
      .find((m) => m.to === to)!.by;
    const res = await (by === 'grinder' ? s.grinder : s.builder).post(`/api/orders/${order.id}/move`, { version: order.version, to, ...extras(to) });
    expect(res.status).toBe(200);
    order = res.body.order;
  }
  return { ...s, order };
}

describe('order messages', { timeout: 30_000 }, () => {
  it('lets both shops talk in the thread, and nobody else', async () => {
    const s = await issued('Thread');
    const fromGrinder = await s.grinder.post(`/api/orders/${s.order.id}/messages`, { body: 'What core do you send?' });
    expect(fromGrinder.status).toBe(201);
    expect(fromGrinder.body.message).toMatchObject({
      body: 'What core do you send?',
      orderId: s.order.id,
      author: { side: 'grinder', shopName: 'Thread grinding' },
    });
    const fromBuilder = await s.builder.post(`/api/orders/${s.order.id}/messages`, { body: 'Our own, shipping today' });
    expect(fromBuilder.status).toBe(201);
    const thread = await s.grinder.get(`/api/orders/${s.order.id}/messages`);
    expect(thread.body.messages.map((m: { body: string }) => m.body)).toEqual(['Grind on our core', 'What core do you send?', 'Our own, shipping today']);

    const other = await issued('Thread other');
    for (const who of [other.grinder, other.builder]) {
      expect((await who.get(`/api/orders/${s.order.id}/messages`)).status).toBe(404);
      expect((await who.post(`/api/orders/${s.order.id}/messages`, { body: 'Hello' })).status).toBe(404);
    }
    const customer = await memberWithRole(t, s.shopId, 'customer');
    expect((await customer.get(`/api/orders/${s.order.id}/messages`)).status).toBe(404);
    expect((await customer.post(`/api/orders/${s.order.id}/messages`, { body: 'Hello' })).status).toBe(404);
    expect((await s.builder.post(`/api/orders/${s.order.id}/messages`, { body: '  ' })).body.error.fields).toHaveProperty('body');
    expect((await s.builder.get(`/api/orders/${s.order.id}/messages`)).body.messages).toHaveLength(3);
  });

  it('adds a move’s message to the thread', async () => {
    const s = await issued('Move message');
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'changes-asked', message: 'Lash is missing on the exhaust' });
    const thread = (await s.builder.get(`/api/orders/${s.order.id}/messages`)).body.messages;
    expect(thread.at(-1)).toMatchObject({ body: 'Lash is missing on the exhaust', author: { side: 'grinder' } });
  });
});

describe('order e-mail', { timeout: 30_000 }, () => {
  it('mails every grinder on issue, and every builder on quote, changes asked and shipped, with text, HTML and a link to the order', async () => {
    const s = await issued('Mail');
    const secondGrinder = await memberWithRole(t, s.grinderShopId, 'grinder');
    const secondBuilder = await memberWithRole(t, s.shopId, 'builder');
    const tech = await memberWithRole(t, s.shopId, 'tech');
    const link = `${t.url}/orders/${s.order.id}`;

    const issueMail = outboxTo(s.grinder.email);
    expect(issueMail).toHaveLength(1);
    expect(issueMail[0]!.subject).toContain('Mail regrind');
    expect(issueMail[0]!.text).toContain(link);
    expect(issueMail[0]!.html).toContain(`href="${link}"`);
    expect(issueMail[0]!.text).toContain('Grind on our core');
    expect(issueMail[0]!.text).toContain(s.order.checksum);
    // The grinding shop's founder is its first grinder member.
    expect(outboxTo(s.grinderFounder.email)).toHaveLength(1);
    expect(outboxTo(s.builder.email)).toHaveLength(0);

    // The first order is quoted and shipped before the next revision is issued (a superseded revision cannot be quoted).
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') });
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 2, to: 'grinding' });
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 3, to: 'shipped', ...extras('shipped') });

    // A second order to the same shop reaches the grinder who joined since.
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: 2, note: 'Second try' });
    const second = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: edited.body.sheet.version, grinderShopId: s.grinderShopId });
    expect(outboxTo(secondGrinder.email).map((m) => m.text.includes(`/orders/${second.body.order.id}`))).toEqual([true]);

    await s.grinder.post(`/api/orders/${second.body.order.id}/move`, { version: 1, to: 'changes-asked', message: 'Exhaust lash, please' });

    for (const builder of [s.builder, secondBuilder]) {
      const mails = outboxTo(builder.email);
      expect(mails).toHaveLength(3);
      const [quoted, shipped, changes] = mails;
      expect(quoted!.text).toContain('$485.00');
      expect(quoted!.text).toContain('6 days');
      expect(shipped!.text).toContain('TRK-0001');
      expect(changes!.text).toContain('Exhaust lash, please');
      for (const m of [quoted!, shipped!]) {
        expect(m.text).toContain(link);
        expect(m.html).toContain(`href="${link}"`);
      }
      expect(changes!.html).toContain(`/orders/${second.body.order.id}"`);
      for (const m of mails) expect(m.html).toMatch(/^<!doctype html>/);
    }
    // Grinding is no mail; techs and grinders get none of the builder mail.
    expect(outboxTo(tech.email)).toHaveLength(0);
    expect(outboxTo(s.grinder.email)).toHaveLength(2);
  });

  it('escapes what people type before it goes into the HTML part', async () => {
    const s = await setup('Escape');
    await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: 1, grinderShopId: s.grinderShopId, note: '<b>rush</b> & thanks' });
    const [mail] = outboxTo(s.grinder.email);
    expect(mail!.html).toContain('&lt;b&gt;rush&lt;/b&gt; &amp; thanks');
    expect(mail!.text).toContain('<b>rush</b> & thanks');
  });
});

describe('development mailbox', { timeout: 30_000 }, () => {
  it('shows a signed-in person only the mail addressed to them (finding 1), pages it, and is absent when dev tools are off', async () => {
    const s = await issued('Mailbox');
    const list = await s.grinder.get('/api/dev/outbox');
    expect(list.status).toBe(200);
    const mine = list.body.messages.find((m: { subject: string }) => m.subject.includes('Mailbox regrind'));
    expect(mine).toMatchObject({ to: s.grinder.email });
    expect(list.body.messages.every((m: { to: string }) => m.to === s.grinder.email)).toBe(true);
    expect((await s.grinder.get(`/api/dev/outbox/${mine.id}`)).body.message).toEqual(mine);
    // A stranger who signs up reads none of it: not in the list, and not by id.
    const anon = await signUp(t, 'Reader');
    const theirs = await anon.get('/api/dev/outbox');
    expect(theirs.status).toBe(200);
    expect(theirs.body.messages.every((m: { to: string }) => m.to === anon.email)).toBe(true);
    expect(JSON.stringify(theirs.body)).not.toContain('Mailbox regrind');
    expect((await anon.get(`/api/dev/outbox/${mine.id}`)).status).toBe(404);
    expect((await anon.get('/api/dev/outbox/nope')).status).toBe(404);
    expect((await new Client(t.url).get('/api/dev/outbox')).status).toBe(401);
    // Pages of one walk every message once.
    const all = (await s.grinder.get('/api/dev/outbox?limit=200')).body.messages.map((m: { id: string }) => m.id);
    const walked: string[] = [];
    let cursor: string | null = null;
    do {
      const page = await s.grinder.get(`/api/dev/outbox?limit=1${cursor ? `&cursor=${cursor}` : ''}`);
      walked.push(...page.body.messages.map((m: { id: string }) => m.id));
      cursor = page.body.nextCursor as string | null;
    } while (cursor);
    expect(walked).toEqual(all);
    const bad = await s.grinder.get('/api/dev/outbox?limit=500&cursor=zz');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toContain('limit');

    const prod = await createTestApp({ devTools: false });
    try {
      const person = await signUp(prod, 'Prod reader');
      expect((await person.get('/api/dev/outbox')).status).toBe(404);
      expect((await person.get(`/api/dev/outbox/${mine.id}`)).status).toBe(404);
    } finally {
      await prod.close();
    }
  });
});

describe('demo data', { timeout: 60_000 }, () => {
  it('lets the demo builder issue the demo sheet to the demo grinding shop, whose grinder sees it and quotes it', async () => {
    const demo = await createTestApp();
    try {
      await seedDemo(demo.db, demo.app.auth);
      const signIn = async (role: string) => {
        const client = new Client(demo.url);
        const email = demoAccounts.find((a) => a.role === role)!.email;
        expect((await client.post('/api/auth/sign-in/email', { email, password: demoPassword })).status).toBe(200);
        return client;
      };
      const builder = await signIn('builder');
      const grinder = await signIn('grinder');
      const shops = (await builder.get('/api/grinding-shops')).body.shops;
      expect(shops).toHaveLength(1);
      const kestrel = shops[0];
      expect(kestrel.name).toMatch(/demo/);
      expect((await grinder.get('/api/incoming')).body.orders).toEqual([]);

      const sheet = (await builder.get(`/api/sheets/${demoSheetId}`)).body.sheet;
      const res = await builder.post(`/api/sheets/${demoSheetId}/issue`, { version: sheet.version, grinderShopId: kestrel.id });
      expect(res.status).toBe(201);
      const incoming = (await grinder.get('/api/incoming')).body.orders;
      expect(incoming.map((o: { id: string }) => o.id)).toEqual([res.body.order.id]);
      const detail = (await grinder.get(`/api/orders/${res.body.order.id}`)).body.order;
      const job = demo.db
        .select()
        .from(schema.jobs)
        .all()
        .find((j) => j.id === demoJobId)!;
      expect(detail.vehicle).toBe(job.vehicle);
      expect(JSON.stringify(detail)).not.toContain(job.customerName);
      const grinderEmail = demoAccounts.find((a) => a.role === 'grinder')!.email;
      expect(
        demo.db
          .select()
          .from(schema.outbox)
          .all()
          .map((m) => m.to),
      ).toEqual([grinderEmail]);
      const quoted = await grinder.post(`/api/orders/${detail.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') });
      expect(quoted.status).toBe(200);
    } finally {
      await demo.close();
    }
  });
});

describe('a later revision supersedes the earlier orders', { timeout: 30_000 }, () => {
  it("leaves the earlier order off the grinder's list, refuses to quote it with a 409, marks it superseded, and never changes its revision", async () => {
    const s = await issued('Superseded');
    const before = t.db.$client.prepare('select * from sheet_revisions where id = ?').get(s.order.revisionId);
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: 2, spec: makeProfileSpec({ icl: 107 }) });
    const second = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: edited.body.sheet.version, grinderShopId: s.grinderShopId });
    expect(second.status).toBe(201);
    expect(second.body.order).toMatchObject({ revisionNumber: 2, supersededBy: null });

    const incoming = (await s.grinder.get('/api/incoming')).body.orders as { id: string }[];
    expect(incoming.map((o) => o.id)).toEqual([second.body.order.id]);

    const old = (await s.grinder.get(`/api/orders/${s.order.id}`)).body.order;
    expect(old.supersededBy).toEqual({ number: 2, at: second.body.order.issuedAt });
    expect(old.revision.supersededBy).toEqual({ number: 2, at: second.body.order.issuedAt });
    expect(old.events.map((e: { action: string }) => e.action)).toEqual(['issue', 'supersede']);

    const quote = await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') });
    expect(quote.status).toBe(409);
    expect(quote.body.error).toMatchObject({
      code: 'superseded',
      message: expect.stringMatching(/Revision 1 .* superseded by revision 2 .* cannot be quoted/),
    });
    expect((await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'changes-asked', message: 'Hm' })).status).toBe(409);
    expect((await s.grinder.get(`/api/orders/${s.order.id}`)).body.order).toMatchObject({ stage: 'sent', version: 1 });
    expect(t.db.$client.prepare('select * from sheet_revisions where id = ?').get(s.order.revisionId)).toEqual(before);

    // The builder's sheet says which revisions are superseded; the live one can be quoted.
    const sheet = (await s.builder.get(`/api/sheets/${s.sheet.id}`)).body.sheet;
    expect(sheet.revisions.map((r: { number: number; supersededBy: unknown }) => [r.number, r.supersededBy])).toEqual([
      [1, { number: 2, at: second.body.order.issuedAt }],
      [2, null],
    ]);
    const orders = (await s.builder.get(`/api/sheets/${s.sheet.id}/orders`)).body.orders as { revisionNumber: number; supersededBy: unknown }[];
    expect(orders.map((o) => [o.revisionNumber, o.supersededBy === null])).toEqual([
      [2, true],
      [1, false],
    ]);
    expect((await s.grinder.post(`/api/orders/${second.body.order.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') })).status).toBe(200);
  });

  it('keeps an order the grinder had started grinding on the list, marked superseded, and lets it go on', async () => {
    const s = await issued('Under way');
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') });
    await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 2, to: 'grinding' });
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: 2, note: 'Next time' });
    const second = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: edited.body.sheet.version, grinderShopId: s.grinderShopId });
    const incoming = (await s.grinder.get('/api/incoming')).body.orders as { id: string; supersededBy: unknown }[];
    expect(incoming.map((o) => [o.id, o.supersededBy !== null])).toEqual([
      [second.body.order.id, false],
      [s.order.id, true],
    ]);
    expect((await s.grinder.post(`/api/orders/${s.order.id}/move`, { version: 3, to: 'shipped', ...extras('shipped') })).status).toBe(200);
  });

  it('mails the grinder of each order a new revision supersedes: closed before grinding, or under way', async () => {
    const s = await issued('Told');
    const other = await makeShop(t, 'grinding', 'Told other grinding');
    const otherGrinder = await memberWithRole(t, other.shopId, 'grinder');
    const supersededMail = (email: string) => outboxTo(email).filter((m) => /superseded/i.test(m.subject));

    // Revision 2 goes to another grinding shop: the first shop hears its order is closed, and not who has the work now.
    const edited = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: 2, note: 'Second' });
    const second = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, {
      version: edited.body.sheet.version,
      grinderShopId: other.shopId,
      confirm: fleetReason,
    });
    expect(second.status).toBe(201);
    const [closed, ...more] = supersededMail(s.grinder.email);
    expect(more).toHaveLength(0);
    expect(closed!.subject).toContain('Told regrind');
    expect(closed!.text).toContain('revision 1');
    expect(closed!.text).toContain('revision 2');
    expect(closed!.text).toMatch(/closed/);
    expect(closed!.text).toMatch(/do not grind/i);
    expect(closed!.text).toContain(`${t.url}/orders/${s.order.id}`);
    expect(closed!.text).not.toContain('Told other grinding');
    expect(supersededMail(otherGrinder.email)).toHaveLength(0);

    // Revision 3 supersedes revision 2 while it is on the grinder: that shop hears it is under way and both shops decide.
    await otherGrinder.post(`/api/orders/${second.body.order.id}/move`, { version: 1, to: 'quoted', ...extras('quoted') });
    await otherGrinder.post(`/api/orders/${second.body.order.id}/move`, { version: 2, to: 'grinding' });
    const sheetNow = (await s.builder.get(`/api/sheets/${s.sheet.id}`)).body.sheet;
    const again = await s.builder.patch(`/api/sheets/${s.sheet.id}`, { version: sheetNow.version, note: 'Third' });
    expect(again.status).toBe(200);
    const third = await s.builder.post(`/api/sheets/${s.sheet.id}/issue`, { version: again.body.sheet.version, grinderShopId: other.shopId });
    expect(third.status).toBe(201);
    const [underWay, ...others] = supersededMail(otherGrinder.email);
    expect(others).toHaveLength(0);
    expect(underWay!.text).toContain('revision 3');
    expect(underWay!.text).toContain('On the grinder');
    expect(underWay!.text).toContain('Told repair');
    expect(underWay!.text).toContain(`${t.url}/orders/${second.body.order.id}`);
    // Revision 1 was superseded already: its shop is not told again.
    expect(supersededMail(s.grinder.email)).toHaveLength(1);
  });

  it("gives the grinder the profile's core notes on the issued revision", async () => {
    const s = await issued('Core notes');
    const detail = (await s.grinder.get(`/api/orders/${s.order.id}`)).body.order;
    expect(detail.revision.coreNotes).toBe('Test core');
    expect(detail.revision.note).toBe('');
  });
});
