/** Reads the server's settings from the environment, with safe defaults for one machine. */
export function readConfig(env: NodeJS.ProcessEnv = process.env) {
  const port = Number(env.PORT ?? 8080);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a port number, got ${env.PORT}`);
  const baseURL = env.PUBLIC_URL ?? `http://localhost:${port}`;
  const authRateLimit = env.AUTH_RATE_LIMIT ?? 'on';
  if (authRateLimit !== 'on' && authRateLimit !== 'off') throw new Error(`AUTH_RATE_LIMIT must be on or off, got ${authRateLimit}`);
  const jobsPerMinute = Number(env.JOBS_PER_MINUTE ?? 30);
  if (!Number.isInteger(jobsPerMinute) || jobsPerMinute < 1) throw new Error(`JOBS_PER_MINUTE must be a whole number above 0, got ${env.JOBS_PER_MINUTE}`);
  const secret = env.BETTER_AUTH_SECRET ?? '';
  if (env.NODE_ENV === 'production' && secret.length < 32) {
    throw new Error('Set BETTER_AUTH_SECRET to a random string of at least 32 characters in production');
  }
  return {
    port,
    baseURL,
    secret: secret || 'lobewright-local-development-secret-change-me',
    databasePath: env.DATABASE_PATH || 'data/lobewright.sqlite',
    webDir: env.WEB_DIR || 'dist',
    /** Unset: e-mail is kept in the database's outbox table. */
    smtpUrl: env.SMTP_URL || undefined,
    mailFrom: env.MAIL_FROM || undefined,
    payments: readPaymentConfig(env),
    /** Limit sign-in and sign-up attempts per network address (on unless AUTH_RATE_LIMIT=off). */
    authRateLimit: authRateLimit === 'on',
    /** Jobs one shop may create a minute (JOBS_PER_MINUTE, default 30). */
    jobsPerMinute,
  };
}

/** The real payment service when STRIPE_SECRET_KEY is set (its webhook secret is then required); otherwise the local fake. */
function readPaymentConfig(env: NodeJS.ProcessEnv) {
  const currency = (env.PAYMENT_CURRENCY || 'usd').toLowerCase();
  if (!/^[a-z]{3}$/.test(currency)) throw new Error(`PAYMENT_CURRENCY must be a three-letter currency code, got ${env.PAYMENT_CURRENCY}`);
  if (env.STRIPE_SECRET_KEY) {
    if (!env.STRIPE_WEBHOOK_SECRET) throw new Error('Set STRIPE_WEBHOOK_SECRET (the webhook signing secret) together with STRIPE_SECRET_KEY');
    return { kind: 'service' as const, secretKey: env.STRIPE_SECRET_KEY, webhookSecret: env.STRIPE_WEBHOOK_SECRET, currency };
  }
  const fakePort = Number(env.PAYMENTS_FAKE_PORT ?? 0);
  if (!Number.isInteger(fakePort) || fakePort < 0 || fakePort > 65535) throw new Error(`PAYMENTS_FAKE_PORT must be a port number, got ${env.PAYMENTS_FAKE_PORT}`);
  return { kind: 'local-fake' as const, fakePort, currency };
}
