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
