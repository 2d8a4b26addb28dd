import { openDb } from '@/db';
import { demoSignInText } from '@/db/seed';

import { createApp } from './app';
import { loadDotEnv, readConfig } from './config';
import { createMailer } from './mail';
import { createMailSender } from './mail/sender';
import { servicePayments, startLocalPayments } from './payments';
import { defaultAuthRateLimit } from './security';
import { demoAccountsWithPublishedPassword, hasDemoAccounts, sweepPartialUploads } from './startup';

loadDotEnv();
const config = readConfig();
const db = openDb(config.databasePath);
const mailer = createMailer({ db, smtpUrl: config.smtpUrl });
// With SMTP_URL, this process sends the queued mail (retrying with backoff); without it mail is only kept.
const sender = config.smtpUrl ? createMailSender({ db, smtpUrl: config.smtpUrl, from: config.mailFrom }) : undefined;
const authRateLimit = config.authRateLimit ? defaultAuthRateLimit : false;

function fail(reason: string): never {
  console.error(`Lobewright did not start: ${reason}`);
  process.exit(1);
}

async function main() {
  if (config.mode === 'production') {
    const open = await demoAccountsWithPublishedPassword(db);
    if (open.length)
      fail(`demo accounts still have the published demo password (${open.join(', ')}). Delete them or change their passwords before serving in production.`);
  }
  // `npm run dev` sets DEV_WEB_PROXY so one origin serves the API and the Expo dev server's live bundle (a dev dependency, loaded only then).
  const devWebProxy = process.env.DEV_WEB_PROXY
    ? (await import('http-proxy-middleware')).createProxyMiddleware({ target: process.env.DEV_WEB_PROXY, ws: true })
    : undefined;
  const pay = config.payments;
  const local = pay.kind === 'local-fake' ? await startLocalPayments({ publicUrl: config.baseURL, port: pay.fakePort, currency: pay.currency }) : undefined;
  const payments = pay.kind === 'service' ? servicePayments(pay) : local?.payments;
  const app = createApp({
    db,
    baseURL: config.baseURL,
    secret: config.secret,
    webDir: config.webDir,
    devWebProxy,
    mailer,
    payments,
    currency: pay.currency,
    authRateLimit,
    jobCreateRateLimit: { limit: config.jobsPerMinute, windowMs: 60_000 },
    devTools: config.devTools,
    mode: config.mode,
    trustProxy: config.trustProxy,
  });
  const swept = sweepPartialUploads(app.deps.uploadsDir);

  const server = app.listen(config.port, (error?: Error) => {
    if (error) fail(`could not listen on port ${config.port}: ${error.message}`);
    // The same list the app's demo banner reads from /api/instance, in words with addresses.
    const named = { payments: `local test payment service at ${local?.origin} (no real money)`, mailbox: 'dev mailbox at /mailbox' } as const;
    const fakes = [...app.instance.fakes.map((f) => named[f]), ...(mailer.kind === 'smtp' ? [] : ['e-mail kept in the outbox (no SMTP_URL)'])];
    console.log(`Lobewright is serving ${config.baseURL} in ${config.mode} mode (database ${config.databasePath})`);
    console.log(fakes.length ? `Local fakes running: ${fakes.join('; ')}` : 'Local fakes running: none');
    console.log(
      pay.kind === 'service'
        ? 'Deposits go to the payment service (STRIPE_SECRET_KEY)'
        : pay.kind === 'off'
          ? "Card deposits are off (PAYMENTS=off): the owner's page says the shop takes them in person"
          : 'Deposits go to the local test payment service',
    );
    if (swept) console.log(`Removed ${swept} unfinished upload file(s) left by an interrupted request`);
    if (config.mode === 'demo' && hasDemoAccounts(db)) console.log(demoSignInText(config.baseURL));
    sender?.start(mailer);
  });

  function shutdown() {
    server.close(async () => {
      await sender?.stop();
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
