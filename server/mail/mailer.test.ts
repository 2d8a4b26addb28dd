import net, { type AddressInfo } from 'node:net';

import { describe, expect, it } from 'vitest';

import { openDb, schema } from '@/db';

import { createMailer } from './index';
import { orderLink, orderMail } from './order-mail';

describe('local mailer', () => {
  it('builds a real text + HTML message and keeps it in the outbox', async () => {
    const db = openDb(':memory:');
    const mailer = createMailer({ db });
    expect(mailer.kind).toBe('outbox');
    await mailer.send({ to: 'builder@example.test', subject: 'Test subject', text: 'Plain words', html: '<p>Marked words</p>' });
    const rows = db.select().from(schema.outbox).all();
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ to: 'builder@example.test', subject: 'Test subject', text: 'Plain words', html: '<p>Marked words</p>' });
  });

  it('refuses a message that nodemailer builds without an HTML part, and stores nothing', async () => {
    const db = openDb(':memory:');
    const mailer = createMailer({ db });
    await expect(mailer.send({ to: 'a@example.test', subject: 's', text: 'only text', html: '' })).rejects.toThrow(/text and an HTML part/);
    expect(db.select().from(schema.outbox).all()).toHaveLength(0);
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

/** A tiny SMTP receiver on loopback (plain, no auth): enough for nodemailer to deliver one message to it. */
function smtpReceiver() {
  const received: string[] = [];
  const server = net.createServer((socket) => {
    let data = false;
    let buffer = '';
    socket.write('220 test.local ready\r\n');
    socket.on('data', (chunk) => {
      buffer += chunk.toString('utf8');
      if (data) {
        const end = buffer.indexOf('\r\n.\r\n');
        if (end === -1) return;
        received.push(buffer.slice(0, end));
        buffer = buffer.slice(end + 5);
        data = false;
        socket.write('250 queued\r\n');
      }
      let nl: number;
      while (!data && (nl = buffer.indexOf('\r\n')) !== -1) {
        const line = buffer.slice(0, nl);
        buffer = buffer.slice(nl + 2);
        const verb = line.slice(0, 4).toUpperCase();
        if (verb === 'EHLO' || verb === 'HELO') socket.write('250 test.local\r\n');
        else if (verb === 'DATA') {
          data = true;
          socket.write('354 go ahead\r\n');
        } else if (verb === 'QUIT') socket.end('221 bye\r\n');
        else socket.write('250 ok\r\n');
      }
    });
  });
  return new Promise<{ port: number; received: string[]; close: () => void }>((resolve) => {
    server.listen(0, '127.0.0.1', () =>
      resolve({ port: (server.address() as AddressInfo).port, received, close: () => server.close() }),
    );
  });
}

describe('SMTP mailer', () => {
  it('sends through SMTP_URL with both parts and keeps nothing in the outbox', async () => {
    const receiver = await smtpReceiver();
    try {
      const db = openDb(':memory:');
      const mailer = createMailer({ db, smtpUrl: `smtp://127.0.0.1:${receiver.port}?ignoreTLS=true`, from: 'Test Shop <shop@example.test>' });
      expect(mailer.kind).toBe('smtp');
      await mailer.send({ to: 'grinder@example.test', subject: 'Over the wire', text: 'Plain part', html: '<p>HTML part</p>' });
      expect(receiver.received).toHaveLength(1);
      const raw = receiver.received[0]!;
      expect(raw).toMatch(/^To: grinder@example\.test/m);
      expect(raw).toMatch(/^From: Test Shop <shop@example\.test>/m);
      expect(raw).toMatch(/multipart\/alternative/);
      expect(raw).toContain('Plain part');
      expect(raw).toContain('<p>HTML part</p>');
      expect(db.select().from(schema.outbox).all()).toHaveLength(0);
    } finally {
      receiver.close();
    }
  });
});
