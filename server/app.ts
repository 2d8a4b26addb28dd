import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import express, { type Request, type Response } from 'express';
import { toNodeHandler } from 'better-auth/node';

import type { Db } from '@/db';
import type { Instance } from '@/shared/instance';

import { createAuth } from './auth';
import type { Mode } from './config';
import type { AppDeps } from './deps';
import { errorHandler, HttpError, sendError } from './http';
import { createMailer, type Mailer } from './mail';
import type { Payments } from './payments';
import { calcRouter, type CalcRateLimit } from './routes/calc';
import { checklistRouter } from './routes/checklist';
import { devOutboxRouter } from './routes/dev-outbox';
import { enginesRouter } from './routes/engines';
import { fitChecksRouter } from './routes/fit-checks';
import { jobsRouter, type JobCreateRateLimit } from './routes/jobs';
import { measurementsRouter } from './routes/measurements';
import { meRouter } from './routes/me';
import { ordersRouter } from './routes/orders';
import { ownerPageDeskRouter, ownerPageRouter, type ShareRateLimit } from './routes/owner-page';
import { paymentWebhook } from './routes/payment-webhook';
import { photosRouter } from './routes/photos';
import { profilesRouter } from './routes/profiles';
import { sheetsRouter } from './routes/sheets';
import { shopMailRouter } from './routes/shop-mail';
import { teamRouter } from './routes/team';
import { shopLimitsRouter } from './routes/shop-limits';
import { pingDatabase } from './store/db';
import {
  authBodyParser,
  defaultAuthRateLimit,
  jsonBodyLimit,
  requireSameOrigin,
  securityHeaders,
  setClientAddress,
  withRateLimitAnswers,
  type AuthRateLimit,
} from './security';

export type CreateAppOptions = {
  db: Db;
  /** Public origin, used by sign-in for cookies and trusted origins. */
  baseURL: string;
  /** Secret that signs session cookies. */
  secret: string;
  /** Folder holding the web export (index.html and assets); omitted in API-only tests. */
  webDir?: string;
  /** In development, forward every non-API request to the Expo dev server at this URL instead of serving webDir. */
  devWebProxy?: express.RequestHandler;
  /** Jobs one shop may create (default 30 a minute); tests that create many jobs raise it. */
  jobCreateRateLimit?: JobCreateRateLimit;
  /** Requests per person to the calc API (default 60 a minute). */
  calcRateLimit?: CalcRateLimit;
  /** Folder for uploaded photos (one sub-folder per shop); default `uploads` beside the database. Tests pass a temp folder. */
  uploadsDir?: string;
  /** Sends e-mail; default: the local transport that keeps each message in the outbox table. */
  mailer?: Mailer;
  /** Development tools such as the outbox API (`/api/dev/*`); default on unless NODE_ENV is production. */
  devTools?: boolean;
  /** Deposit payments (the payment SDK, pointed at the local fake or the real service); unset, deposits answer 503. */
  payments?: Payments;
  /** Currency of prices when payments are off (with payments on, theirs); default usd. */
  currency?: string;
  /** Requests per address to the owner's share pages (default 120 a minute). */
  shareRateLimit?: ShareRateLimit;
  /** Demo or production (server/config.ts); shown by the app's demo banner. Default: demo unless NODE_ENV is production. */
  mode?: Mode;
  /** Express's `trust proxy` (TRUST_PROXY); default false: X-Forwarded-For is ignored. */
  trustProxy?: boolean | number | string;
  /** Attempts per network address on the sign-in routes (server/security.ts); default on when NODE_ENV is production, false turns it off. */
  authRateLimit?: AuthRateLimit | false;
};

const dev = process.env.NODE_ENV !== 'production';

/** Builds the whole app without listening, so tests can drive it on an in-memory database. */
export function createApp({
  db,
  baseURL,
  secret,
  webDir,
  devWebProxy,
  calcRateLimit,
  jobCreateRateLimit,
  uploadsDir,
  mailer,
  devTools = dev,
  payments,
  currency = 'usd',
  shareRateLimit,
  authRateLimit,
  mode = dev ? 'demo' : 'production',
  trustProxy = false,
}: CreateAppOptions) {
  const mail = mailer ?? createMailer({ db });
  const auth = createAuth({ db, baseURL, secret, rateLimit: authRateLimit ?? (dev ? false : defaultAuthRateLimit), mailer: mail });
  const deps: AppDeps = {
    db,
    auth,
    uploadsDir: path.resolve(uploadsDir ?? defaultUploadsDir(db)),
    mailer: mail,
    publicUrl: baseURL,
    payments,
    currency: payments?.currency ?? currency,
  };
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', trustProxy);
  app.use(securityHeaders({ baseURL, contentSecurityPolicy: !devWebProxy }));

  // better-auth parses its own bodies, so it goes before the JSON parser; authBodyParser only caps their size.
  app.all('/api/auth/{*splat}', setClientAddress, authBodyParser, toNodeHandler(withRateLimitAnswers((request) => auth.handler(request))));
  // The payment webhook's signature covers the raw body, so it is read before the JSON parser too.
  app.use('/api', paymentWebhook(deps));
  app.use('/api', requireSameOrigin(baseURL));
  app.use('/api', express.json({ limit: jsonBodyLimit }));

  app.get('/api/health', (_req, res) => {
    pingDatabase(db);
    res.json({ ok: true });
  });
  // What kind of server this is, for the app's demo banner: no secrets, no account needed.
  const instance: Instance = {
    mode,
    fakes: [...(payments?.kind === 'local-fake' ? (['payments'] as const) : []), ...(devTools ? (['mailbox'] as const) : [])],
    depositsOn: payments !== undefined,
  };
  app.get('/api/instance', (_req, res) => void res.json({ instance }));
  app.use('/api', meRouter(deps));
  app.use('/api/jobs', jobsRouter(deps, jobCreateRateLimit));
  app.use('/api', enginesRouter(deps), profilesRouter(deps), sheetsRouter(deps), calcRouter(deps, calcRateLimit));
  app.use('/api', measurementsRouter(deps), photosRouter(deps), checklistRouter(deps), shopLimitsRouter(deps), fitChecksRouter(deps));
  app.use('/api', ordersRouter(deps), ownerPageDeskRouter(deps), ownerPageRouter(deps, shareRateLimit), teamRouter(deps), shopMailRouter(deps));
  if (devTools) app.use('/api', devOutboxRouter(deps));
  app.use('/api', (req, res) => sendError(res, new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}`)));

  if (devWebProxy) app.use(devWebProxy);
  else if (webDir) serveWeb(app, webDir);
  app.use(errorHandler);
  return Object.assign(app, { auth, deps, instance });
}

/** `uploads` in the database's folder (the data folder); a temp folder for an in-memory database. */
export function defaultUploadsDir(db: Db): string {
  const file = db.$client.name;
  if (!file || file === ':memory:') return path.join(os.tmpdir(), 'lobewright-uploads');
  return path.join(path.dirname(file), 'uploads');
}

/** Serves the static web export. Paths that look like files must exist (404 otherwise); other paths get the app shell. */
function serveWeb(app: express.Express, webDir: string) {
  const indexFile = path.join(webDir, 'index.html');
  app.use(express.static(webDir, { index: false, maxAge: dev ? 0 : '1h' }));
  app.get('/{*splat}', (req: Request, res: Response) => {
    if (path.extname(req.path) !== '' || !fs.existsSync(indexFile)) {
      return sendError(res, new HttpError(404, 'not_found', `No file at ${req.path}`));
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(path.resolve(indexFile));
  });
}

export type App = ReturnType<typeof createApp>;
