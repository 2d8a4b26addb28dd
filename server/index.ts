import cluster, { type Worker } from 'node:cluster';

import { openDb, type Db } from '@/db';
import { demoSignInText } from '@/db/seed';

import { createApp, defaultUploadsDir } from './app';
import { authSecret, loadDotEnv, readConfig } from './config';
import { createMailer } from './mail';
import { createMailSender } from './mail/sender';
import { localPaymentsClient, servicePayments, startLocalPayments, type LocalPaymentsConnection } from './payments';
import { defaultAuthRateLimit } from './security';
import { demoAccountsWithPublishedPassword, hasDemoAccounts, sweepPartialUploads } from './startup';

loadDotEnv();
const config = readConfig();
const pay = config.payments;
const workers = config.webConcurrency;

/** What the primary hands each worker in its environment (never on the command line): the local fake's port and secrets, and who sends mail. */
type WorkerEnv = { LOBEWRIGHT_PAYMENTS_FAKE?: string; LOBEWRIGHT_SENDS_MAIL: '0' | '1' };

function fail(reason: string): never {
  console.error(`Lobewright did not start: ${reason}`);
  process.exit(1);
}

/** Checks made once per start, before anything listens: a production database still open with the demo password is refused. */
async function preflight(db: Db): Promise<number> {
  if (config.mode === 'production') {
    const open = await demoAccountsWithPublishedPassword(db);
    if (open.length)
      fail(`demo accounts still have the published demo password (${open.join(', ')}). Delete them or change their passwords before serving in production.`);
  }
  return sweepPartialUploads(defaultUploadsDir(db));
}

/** The start line: the address, the mode, the processes and every local fake, then the demo sign-ins. */
function announce(db: Db, { fakeOrigin, smtp, swept, pids }: { fakeOrigin?: string; smtp: boolean; swept: number; pids: number[] }) {
  const fakes = [
    ...(fakeOrigin ? [`local test payment service at ${fakeOrigin} (no real money)`] : []),
    ...(config.devTools ? ['dev mailbox at /mailbox'] : []),
    ...(smtp ? [] : ['e-mail kept in the outbox (no SMTP_URL)']),
  ];
  console.log(`Lobewright is serving ${config.baseURL} in ${config.mode} mode (database ${config.databasePath})`);
  if (pids.length > 1) console.log(`Server processes: ${pids.length} workers on one database file (WEB_CONCURRENCY), pids ${pids.join(', ')}`);
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
}

/**
 * One server process: the API and the web export on the port. Alone (WEB_CONCURRENCY=1) it also
 * makes the start-up checks, runs the local payment fake and sends mail; as a worker the primary
 * did the first two and names the one worker that sends.
 */
async function serve(role: { worker: false } | { worker: true; fake?: LocalPaymentsConnection; sendsMail: boolean }) {
  const db = openDb(config.databasePath);
  const swept = role.worker ? 0 : await preflight(db);
  const mailer = createMailer({ db, smtpUrl: config.smtpUrl });
  // With SMTP_URL, one process sends the queued mail (retrying with backoff); without it mail is only kept.
  const sends = config.smtpUrl && (!role.worker || role.sendsMail);
  const sender = sends ? createMailSender({ db, smtpUrl: config.smtpUrl!, from: config.mailFrom }) : undefined;
  // `npm run dev` sets DEV_WEB_PROXY so one origin serves the API and the Expo dev server's live bundle (a dev dependency, loaded only then).
  const devWebProxy = process.env.DEV_WEB_PROXY
    ? (await import('http-proxy-middleware')).createProxyMiddleware({ target: process.env.DEV_WEB_PROXY, ws: true })
    : undefined;
  const local =
    pay.kind === 'local-fake' && !role.worker ? await startLocalPayments({ publicUrl: config.baseURL, port: pay.fakePort, currency: pay.currency }) : undefined;
  const payments =
    pay.kind === 'service'
      ? servicePayments(pay)
      : pay.kind === 'local-fake'
        ? (local?.payments ?? (role.worker && role.fake ? localPaymentsClient(role.fake, pay.currency) : undefined))
        : undefined;
  const app = createApp({
    db,
    baseURL: config.baseURL,
    secret: authSecret(config),
    webDir: config.webDir,
    devWebProxy,
    mailer,
    payments,
    currency: pay.currency,
    authRateLimit: config.authRateLimit ? defaultAuthRateLimit : false,
    jobCreateRateLimit: { limit: config.jobsPerMinute, windowMs: 60_000 },
    devTools: config.devTools,
    mode: config.mode,
    trustProxy: config.trustProxy,
  });

  const server = app.listen(config.port, (error?: Error) => {
    if (error) fail(`could not listen on port ${config.port}: ${error.message}`);
    if (!role.worker) announce(db, { fakeOrigin: local?.origin, smtp: mailer.kind === 'smtp', swept, pids: [process.pid] });
    sender?.start(mailer);
  });

  let closing = false;
  function shutdown() {
    if (closing) return;
    closing = true;
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

/**
 * WEB_CONCURRENCY above 1: this process migrates the file and makes the start-up checks once,
 * runs the local payment fake, forks the workers (Node's cluster module shares the port) and
 * replaces one that dies. Worker 1 sends the mail; its replacement takes that over.
 */
async function primary() {
  const db = openDb(config.databasePath); // migrations run here, once, before any worker opens the file
  const swept = await preflight(db);
  authSecret(config); // the demo secret's file exists before the workers read it
  const local = pay.kind === 'local-fake' ? await startLocalPayments({ publicUrl: config.baseURL, port: pay.fakePort, currency: pay.currency }) : undefined;
  const fakeEnv = local ? { LOBEWRIGHT_PAYMENTS_FAKE: JSON.stringify(local.connection) } : {};
  const sendsMail = new Set<Worker>();
  let stopping = false;
  const fork = (sender: boolean) => {
    const env: WorkerEnv = { ...fakeEnv, LOBEWRIGHT_SENDS_MAIL: sender ? '1' : '0' };
    const worker = cluster.fork(env);
    if (sender) sendsMail.add(worker);
    return worker;
  };
  const first = Array.from({ length: workers }, (_, i) => fork(i === 0));
  let listening = 0;
  cluster.on('listening', () => {
    listening++;
    if (listening === workers) announce(db, { fakeOrigin: local?.origin, smtp: Boolean(config.smtpUrl), swept, pids: first.map((w) => w.process.pid ?? 0) });
  });
  cluster.on('exit', (worker, code, signal) => {
    const sender = sendsMail.delete(worker);
    // A worker that shut down cleanly was told to (Ctrl-C reaches every process in the group).
    if (stopping || code === 0) return;
    console.error(`Worker ${worker.process.pid} ended (${signal ?? code}); starting another`);
    setTimeout(() => fork(sender), 500).unref();
  });

  function shutdown() {
    stopping = true;
    const running = Object.values(cluster.workers ?? {}).filter((w): w is Worker => w !== undefined);
    let left = running.length;
    const done = () => {
      void local?.service.close();
      db.$client.close();
      process.exit(0);
    };
    if (left === 0) done();
    for (const w of running) {
      w.once('exit', () => --left === 0 && done());
      w.process.kill('SIGTERM');
    }
  }
  process.on('SIGINT', shutdown);
  process.on('SIGTERM', shutdown);
}

function workerRole() {
  const fake = process.env.LOBEWRIGHT_PAYMENTS_FAKE;
  return {
    worker: true as const,
    fake: fake ? (JSON.parse(fake) as LocalPaymentsConnection) : undefined,
    sendsMail: process.env.LOBEWRIGHT_SENDS_MAIL === '1',
  };
}

const start = workers === 1 ? serve({ worker: false }) : cluster.isPrimary ? primary() : serve(workerRole());
start.catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
