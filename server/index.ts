import { count, inArray } from 'drizzle-orm';

import { openDb, schema } from '@/db';
import { demoAccounts, demoSignInText } from '@/db/seed';

import { createApp } from './app';
import { readConfig } from './config';
import { createMailer } from './mail';
import { servicePayments, startLocalPayments } from './payments';
import { defaultAuthRateLimit } from './security';

const config = readConfig();
const db = openDb(config.databasePath);
const mailer = createMailer({ db, smtpUrl: config.smtpUrl, from: config.mailFrom });
const authRateLimit = config.authRateLimit ? defaultAuthRateLimit : false;

async function main() {
  // `npm run dev` sets DEV_WEB_PROXY so one origin serves the API and the Expo dev server's live bundle (a dev dependency, loaded only then).
  const devWebProxy = process.env.DEV_WEB_PROXY
    ? (await import('http-proxy-middleware')).createProxyMiddleware({ target: process.env.DEV_WEB_PROXY, ws: true })
    : undefined;
  const pay = config.payments;
  const local = pay.kind === 'service' ? undefined : await startLocalPayments({ publicUrl: config.baseURL, port: pay.fakePort, currency: pay.currency });
  const payments = pay.kind === 'service' ? servicePayments(pay) : local!.payments;
  const app = createApp({ db, baseURL: config.baseURL, secret: config.secret, webDir: config.webDir, devWebProxy, mailer, payments, authRateLimit, jobCreateRateLimit: { limit: config.jobsPerMinute, windowMs: 60_000 } });

  const server = app.listen(config.port, () => {
    console.log(`Lobewright is serving ${config.baseURL} (database ${config.databasePath})`);
    console.log(mailer.kind === 'smtp' ? 'E-mail goes out through SMTP_URL' : 'E-mail is kept in the outbox (no SMTP_URL); open the dev mailbox to read it');
    console.log(local ? `Deposits go to the local test payment service at ${local.origin} (no STRIPE_SECRET_KEY; no real money)` : 'Deposits go to the payment service (STRIPE_SECRET_KEY)');
    const demoUsers = db
      .select({ n: count() })
      .from(schema.users)
      .where(inArray(schema.users.email, demoAccounts.map((a) => a.email)))
      .get();
    if (demoUsers?.n) console.log(demoSignInText(config.baseURL));
  });

  function shutdown() {
    server.close(() => {
      void local?.service.close();
      db.$client.close();
      process.exit(0);
    });
  }
  process.on('SIGINT', shutdown);
  process.on('SIGTERM', shutdown);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
