/** Reads the server's settings from the environment, with safe defaults for one machine. */
export function readConfig(env: NodeJS.ProcessEnv = process.env) {
  const port = Number(env.PORT ?? 8080);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a port number, got ${env.PORT}`);
  const baseURL = env.PUBLIC_URL ?? `http://localhost:${port}`;
  const authRateLimit = env.AUTH_RATE_LIMIT ?? 'on';
  if (authRateLimit !== 'on' && authRateLimit !== 'off') throw new Error(`AUTH_RATE_LIMIT must be on or off, got ${authRateLimit}`);
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
    /** Limit sign-in and sign-up attempts per network address (on unless AUTH_RATE_LIMIT=off). */
    authRateLimit: authRateLimit === 'on',
  };
}
