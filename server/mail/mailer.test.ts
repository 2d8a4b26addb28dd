import { spawn } from 'node:child_process';
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';

import { SMTPServer, type SMTPServerDataStream } from 'smtp-server';
import { afterEach, describe, expect, it } from 'vitest';

import { openDb, schema, type Db } from '@/db';
import { root } from '@/tests/server-process';

import { failedMail, queueMail } from '../store/outbox';
import { createMailer } from './index';
import { orderLink, orderMail } from './order-mail';
import { createMailSender, defaultBackoffMs } from './sender';

const message = (n: number) => ({ to: `person${n}@example.test`, subject: `Mail ${n}`, text: `Plain words ${n}`, html: `<p>Marked words ${n}</p>` });
const outbox = (db: Db) => db.select().from(schema.outbox).all();

describe('local mailer (no SMTP_URL)', () => {
  it('keeps each mail in the outbox for the development mailbox, never to be sent', async () => {
    const db = openDb(':memory:');
    const mailer = createMailer({ db });
    expect(mailer.kind).toBe('outbox');
    await mailer.send(message(1));
    expect(outbox(db)).toEqual([expect.objectContaining({ ...message(1), status: 'kept', attempts: 0, shopId: null })]);
  });

  it('refuses a mail without an HTML part, and stores nothing', async () => {
    const db = openDb(':memory:');
    const mailer = createMailer({ db });
    await expect(mailer.send({ ...message(1), html: '' })).rejects.toThrow(/text and an HTML part/);
    expect(outbox(db)).toHaveLength(0);
  });

  it('writes the mail in the caller’s transaction: a change that rolls back takes its mail with it', () => {
    const db = openDb(':memory:');
    const mailer = createMailer({ db, smtpUrl: 'smtp://127.0.0.1:1' });
    expect(() =>
      db.transaction((tx) => {
        mailer.queue(tx, message(1));
        throw new Error('the change failed');
      }),
    ).toThrow('the change failed');
    expect(outbox(db)).toHaveLength(0);
  });

  it('links to the order page under the public origin, with or without a trailing slash', () => {
    expect(orderLink('https://shop.example.test/', 'abc')).toBe('https://shop.example.test/orders/abc');
    const mail = orderMail(
      'shipped',
      { email: 'b@example.test', name: 'B' },
      {
        orderId: 'o-1',
        publicUrl: 'https://shop.example.test',
        sheetTitle: 'Sheet',
        revisionNumber: 3,
        checksum: '0123456789ab',
        repairShopName: 'Repair',
        grinderShopName: 'Grinder',
        shipping: { carrier: 'Test freight', tracking: 'T-1' },
      },
    );
    expect(mail.text).toContain('https://shop.example.test/orders/o-1');
    expect(mail.text).toContain('0123456789ab');
    expect(mail.html).toContain('href="https://shop.example.test/orders/o-1"');
  });
});

type Received = { raw: string; subject: string; messageId: string };

/**
 * An SMTP server on loopback (the smtp-server package; plain, no auth). `answer` decides each message:
 * 'accept', a refusal with the given SMTP code, or 'hold' (never answer, as when the sender dies mid-send).
 */
async function smtpReceiver(answer: (subject: string, seen: number) => 'accept' | 'hold' | number = () => 'accept') {
  const received: Received[] = [];
  const offered = new Map<string, number>();
  let onHold: (subject: string) => void = () => {};
  const held = new Promise<string>((resolve) => (onHold = resolve));
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream: SMTPServerDataStream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('utf8');
        const subject = /^Subject: (.*)$/m.exec(raw)?.[1]?.trim() ?? '';
        const seen = (offered.get(subject) ?? 0) + 1;
        offered.set(subject, seen);
        const what = answer(subject, seen);
        if (what === 'hold') return onHold(subject);
        if (what !== 'accept') return callback(Object.assign(new Error(`${what} try again later`), { responseCode: what }));
        received.push({ raw, subject, messageId: /^Message-ID: (.*)$/im.exec(raw)?.[1]?.trim() ?? '' });
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.server.address() as AddressInfo;
  return { url: `smtp://127.0.0.1:${port}?ignoreTLS=true`, received, held, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

describe('mail sender (SMTP_URL set)', () => {
  const cleanups: (() => unknown)[] = [];
  afterEach(async () => {
    for (const c of cleanups.splice(0).reverse()) await c();
  });

  it('sends each queued mail once, with both parts and its own Message-ID, and marks it sent', async () => {
    const smtp = await smtpReceiver();
    cleanups.push(smtp.close);
    const db = openDb(':memory:');
    const mailer = createMailer({ db, smtpUrl: smtp.url });
    const sender = createMailSender({ db, smtpUrl: smtp.url, from: 'Test Shop <shop@example.test>' });
    cleanups.push(() => sender.stop());
    db.transaction((tx) => [1, 2].forEach((n) => mailer.queue(tx, message(n))));
    expect(outbox(db).map((m) => m.status)).toEqual(['pending', 'pending']);
    expect(await sender.runDue()).toBe(2);
    expect(await sender.runDue()).toBe(0);
    expect(smtp.received.map((r) => r.subject).sort()).toEqual(['Mail 1', 'Mail 2']);
    const raw = smtp.received.find((r) => r.subject === 'Mail 1')!.raw;
    expect(raw).toMatch(/^To: person1@example\.test/m);
    expect(raw).toMatch(/^From: Test Shop <shop@example\.test>/m);
    expect(raw).toMatch(/multipart\/alternative/);
    expect(raw).toContain('Plain words 1');
    expect(raw).toContain('<p>Marked words 1</p>');
    const rows = outbox(db);
    expect(rows.every((m) => m.status === 'sent' && m.sentAt !== null && m.attempts === 1)).toBe(true);
    expect(smtp.received.find((r) => r.subject === 'Mail 1')!.messageId).toContain(rows.find((m) => m.subject === 'Mail 1')!.id);
  });

  it('retries a refused mail after a backoff, and after the last try marks it failed for its shop to see', async () => {
    // The first try of each mail is refused with 451 (try again later); Mail 2 is refused every time.
    const smtp = await smtpReceiver((subject, seen) => (subject === 'Mail 2' || seen === 1 ? 451 : 'accept'));
    cleanups.push(smtp.close);
    const db = openDb(':memory:');
    const shop = db
      .insert(schema.shops)
      .values({ id: 'shop-1', name: 'Mail test shop', slug: 'mail-test', kind: 'repair', createdAt: new Date() })
      .returning()
      .get();
    const sender = createMailSender({ db, smtpUrl: smtp.url, maxAttempts: 3, backoffMs: () => 60_000 });
    cleanups.push(() => sender.stop());
    db.transaction((tx) => [1, 2].forEach((n) => queueMail(tx, message(n), 'pending', shop.id)));

    const before = Date.now();
    expect(await sender.runDue()).toBe(0);
    const waiting = outbox(db);
    expect(waiting.map((m) => [m.status, m.attempts])).toEqual([
      ['pending', 1],
      ['pending', 1],
    ]);
    for (const m of waiting) {
      expect(m.nextAttemptAt!.getTime()).toBeGreaterThanOrEqual(before + 60_000);
      expect(m.lastError).toMatch(/451/);
    }
    // Not due yet: nothing is tried.
    expect(await sender.runDue()).toBe(0);
    expect(outbox(db).every((m) => m.attempts === 1)).toBe(true);

    const makeDue = () =>
      db
        .update(schema.outbox)
        .set({ nextAttemptAt: new Date(0) })
        .run();
    makeDue();
    expect(await sender.runDue()).toBe(1);
    makeDue();
    expect(await sender.runDue()).toBe(0);
    const byId = Object.fromEntries(outbox(db).map((m) => [m.subject, m]));
    expect(byId['Mail 1']).toMatchObject({ status: 'sent', attempts: 2 });
    expect(byId['Mail 2']).toMatchObject({ status: 'failed', attempts: 3 });
    expect(failedMail(db, shop.id)).toEqual([
      expect.objectContaining({ subject: 'Mail 2', to: 'person2@example.test', attempts: 3, lastError: expect.stringMatching(/451/) }),
    ]);
    expect(failedMail(db, 'another-shop')).toEqual([]);
    expect(smtp.received.map((r) => r.subject)).toEqual(['Mail 1']);
  });

  it('waits 30 s after the first failed try, doubling each time, at most an hour (common practice, no source)', () => {
    expect([1, 2, 3, 4].map(defaultBackoffMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(defaultBackoffMs(20)).toBe(3_600_000);
  });

  it('loses no mail and sends none twice when the sender is killed midway and another takes over', { timeout: 60_000 }, async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lobewright-mail-'));
    cleanups.push(() => fs.rmSync(dir, { recursive: true, force: true }));
    const file = path.join(dir, 'mail.sqlite');
    const db = openDb(file);
    cleanups.push(() => db.$client.close());
    db.transaction((tx) => [1, 2, 3, 4, 5].forEach((n) => queueMail(tx, message(n), 'pending')));
    // The first sender dies while the server is taking Mail 3: the server never answered, so it is not sent.
    const smtp = await smtpReceiver((subject, seen) => (subject === 'Mail 3' && seen === 1 ? 'hold' : 'accept'));
    cleanups.push(smtp.close);

    const startSender = () => {
      const child = spawn(path.join(root, 'node_modules', '.bin', 'tsx'), ['tests/mail-sender-process.ts'], {
        cwd: root,
        env: { ...process.env, DATABASE_PATH: file, SMTP_URL: smtp.url, MAIL_LEASE_MS: '1500' },
        stdio: 'ignore',
        detached: true,
      });
      cleanups.push(() => {
        try {
          process.kill(-child.pid!, 'SIGKILL');
        } catch {
          // already gone
        }
      });
      return child;
    };
    const first = startSender();
    expect(await smtp.held).toBe('Mail 3');
    const gone = new Promise((resolve) => first.once('exit', resolve));
    process.kill(-first.pid!, 'SIGKILL');
    await gone;
    expect(smtp.received.map((r) => r.subject)).toEqual(['Mail 1', 'Mail 2']);

    startSender();
    const deadline = Date.now() + 45_000;
    while (Date.now() < deadline && !outbox(db).every((m) => m.status === 'sent')) await new Promise((r) => setTimeout(r, 100));
    const rows = outbox(db);
    expect(rows.map((m) => m.status)).toEqual(['sent', 'sent', 'sent', 'sent', 'sent']);
    expect(smtp.received.map((r) => r.subject).sort()).toEqual(['Mail 1', 'Mail 2', 'Mail 3', 'Mail 4', 'Mail 5']);
    // Mail 3 was tried twice (the killed try and the one that went out), and arrived once.
    expect(rows.find((m) => m.subject === 'Mail 3')!.attempts).toBe(2);
  });
});
