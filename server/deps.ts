import type { Db } from '@/db';

import type { Auth } from './auth';
import type { Mailer } from './mail';
import type { Payments } from './payments';

/** What every router is built from. Tests pass an in-memory database; nothing is mocked. */
export type AppDeps = {
  db: Db;
  auth: Auth;
  /** Absolute folder for uploaded files, one sub-folder per shop. */
  uploadsDir: string;
  /** Sends e-mail (the outbox table unless SMTP_URL is set). */
  mailer: Mailer;
  /** Public origin for links in e-mail (createApp's baseURL). */
  publicUrl: string;
  /** Deposits through the payment SDK (the local fake unless STRIPE_SECRET_KEY is set); unset: deposits answer 503. */
  payments?: Payments;
  /** Currency of prices and deposits (the payment settings' PAYMENT_CURRENCY). */
  currency: string;
};
