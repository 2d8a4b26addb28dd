/**
 * One mail sender on its own, as a worker process runs it: for the test that kills a sender midway.
 * DATABASE_PATH and SMTP_URL as for the server; MAIL_LEASE_MS is how long a claim holds.
 */
import { openDb } from '@/db';
import { createMailSender } from '@/server/mail/sender';

const db = openDb(process.env.DATABASE_PATH);
const sender = createMailSender({ db, smtpUrl: process.env.SMTP_URL!, leaseMs: Number(process.env.MAIL_LEASE_MS ?? 1000), pollMs: 100, backoffMs: () => 0 });
sender.start();
// The sender's timer does not hold a process open (the server's listener does that); here nothing else would.
setInterval(() => {}, 60_000);
console.log('sender started');
