import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/**
 * Reads `.env` (or the file ENV_FILE names) into the environment with Node's own
 * loader. Settings already in the environment win over the file.
 */
export function loadDotEnv(env: NodeJS.ProcessEnv = process.env) {
  const file = env.ENV_FILE || '.env';
  if (fs.existsSync(file)) process.loadEnvFile(file);
}

/**
 * Demo mode (NODE_ENV anything but production): seeded demo data, printed sign-ins,
 * the dev mailbox and the local test payment service. Production mode: none of those
 * unless a setting asks for the payment fake.
 */
export type Mode = 'demo' | 'production';

/** Reads the server's settings from the environment, with safe defaults for one machine. */
export function readConfig(env: NodeJS.ProcessEnv = process.env) {
  const mode: Mode = env.NODE_ENV === 'production' ? 'production' : 'demo';
  const port = Number(env.PORT ?? 8080);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a port number, got ${env.PORT}`);
  const baseURL = env.PUBLIC_URL ?? `http://localhost:${port}`;
  const authRateLimit = env.AUTH_RATE_LIMIT ?? 'on';
  if (authRateLimit !== 'on' && authRateLimit !== 'off') throw new Error(`AUTH_RATE_LIMIT must be on or off, got ${authRateLimit}`);
  const jobsPerMinute = Number(env.JOBS_PER_MINUTE ?? 30);
  if (!Number.isInteger(jobsPerMinute) || jobsPerMinute < 1) throw new Error(`JOBS_PER_MINUTE must be a whole number above 0, got ${env.JOBS_PER_MINUTE}`);
  const webConcurrency = Number(env.WEB_CONCURRENCY || 1);
  if (!Number.isInteger(webConcurrency) || webConcurrency < 1 || webConcurrency > 64)
    throw new Error(`WEB_CONCURRENCY must be a whole number of processes from 1 to 64, got ${env.WEB_CONCURRENCY}`);
  const secret = env.BETTER_AUTH_SECRET ?? '';
  if (mode === 'production' && secret.length < 32) {
    throw new Error('Set BETTER_AUTH_SECRET to a random string of at least 32 characters in production');
  }
  return {
    mode,
    port,
    baseURL,
    /** Unset in demo mode: a random secret kept beside the database (server/startup.ts demoSecret). */
    secret: secret || undefined,
    /** Server processes on one database file (WEB_CONCURRENCY, default 1): above 1, a primary forks that many workers. */
    webConcurrency,
    databasePath: env.DATABASE_PATH || 'data/lobewright.sqlite',
    webDir: env.WEB_DIR || 'dist',
    /** Unset: e-mail is kept in the database's outbox table. */
    smtpUrl: env.SMTP_URL || undefined,
    mailFrom: env.MAIL_FROM || undefined,
    payments: readPaymentConfig(env, mode),
    /** Limit sign-in and sign-up attempts per network address (on unless AUTH_RATE_LIMIT=off). */
    authRateLimit: authRateLimit === 'on',
    /** The development mailbox (`/api/dev/outbox`): demo mode only. */
    devTools: mode === 'demo',
    trustProxy: readTrustProxy(env.TRUST_PROXY),
    /** Jobs one shop may create a minute (JOBS_PER_MINUTE, default 30). */
    jobsPerMinute,
  };
}

export type Config = ReturnType<typeof readConfig>;

/**
 * The sign-in secret: BETTER_AUTH_SECRET, or in demo mode (production refuses to start
 * without it) a random one made on the first start and kept beside the database, readable by
 * this user alone, so sessions outlive a restart and every worker signs with the same one.
 */
export function authSecret({ secret, databasePath }: Pick<Config, 'secret' | 'databasePath'>): string {
  if (secret) return secret;
  const file = path.join(path.dirname(path.resolve(databasePath)), 'auth-secret');
  fs.mkdirSync(path.dirname(file), { recursive: true });
  try {
    fs.writeFileSync(file, randomBytes(32).toString('base64url'), { flag: 'wx', mode: 0o600 });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
  }
  return fs.readFileSync(file, 'utf8').trim();
}

/**
 * Express's `trust proxy`: unset, X-Forwarded-For is ignored and the address is the
 * connection's; behind a reverse proxy set it to the proxy (`loopback` for one on this
 * machine, a subnet list, or the number of hops).
 */
function readTrustProxy(value: string | undefined): boolean | number | string {
  if (value === undefined || value === '' || value === 'false') return false;
  if (/^\d+$/.test(value)) return Number(value);
  if (value === 'true')
    throw new Error('TRUST_PROXY=true would trust any client to name its own address; name the proxy (loopback, a subnet) or the number of hops');
  return value;
}

/**
 * PAYMENTS picks how deposits are taken: `service` (the real payment service; needs
 * STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET), `local-fake` (the test payment service on
 * this machine; no real money) or `off` (the owner's page says the shop takes the
 * deposit in person). Default: service when a key is set, else local-fake in demo
 * mode and off in production.
 */
function readPaymentConfig(env: NodeJS.ProcessEnv, mode: Mode) {
  const currency = (env.PAYMENT_CURRENCY || 'usd').toLowerCase();
  if (!/^[a-z]{3}$/.test(currency)) throw new Error(`PAYMENT_CURRENCY must be a three-letter currency code, got ${env.PAYMENT_CURRENCY}`);
  const kind = env.PAYMENTS || (env.STRIPE_SECRET_KEY ? 'service' : mode === 'demo' ? 'local-fake' : 'off');
  if (kind === 'off') return { kind: 'off' as const, currency };
  if (kind === 'service') {
    if (!env.STRIPE_SECRET_KEY || !env.STRIPE_WEBHOOK_SECRET)
      throw new Error('PAYMENTS=service needs STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET (the webhook signing secret)');
    return { kind: 'service' as const, secretKey: env.STRIPE_SECRET_KEY, webhookSecret: env.STRIPE_WEBHOOK_SECRET, currency };
  }
  if (kind !== 'local-fake') throw new Error(`PAYMENTS must be service, local-fake or off, got ${kind}`);
  const fakePort = Number(env.PAYMENTS_FAKE_PORT ?? 0);
  if (!Number.isInteger(fakePort) || fakePort < 0 || fakePort > 65535)
    throw new Error(`PAYMENTS_FAKE_PORT must be a port number, got ${env.PAYMENTS_FAKE_PORT}`);
  return { kind: 'local-fake' as const, fakePort, currency };
}
