import type { Db } from '@/db';

import type { Auth } from './auth';

/** What every router is built from. Tests pass an in-memory database; nothing is mocked. */
export type AppDeps = {
  db: Db;
  auth: Auth;
  /** Absolute folder for uploaded files, one sub-folder per shop. */
  uploadsDir: string;
};
