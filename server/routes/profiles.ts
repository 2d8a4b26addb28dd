import { Router } from 'express';

import { profileCopySchema, profileCreateSchema, profilePatchSchema } from '@/shared/profile';

import { actorOf, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { parse } from '../http';
import {
  addJobProfile,
  createLibraryProfile,
  deleteLibraryProfile,
  jobProfiles,
  libraryProfiles,
  loadProfile,
  updateProfile,
  type JobProfileSource,
} from '../store/profiles';

/** A job-profile body either copies a library profile or writes a new one. */
function parseJobProfileBody(body: unknown): JobProfileSource {
  const copy = typeof body === 'object' && body !== null && 'fromProfileId' in body;
  return copy ? { kind: 'copy' as const, ...parse(profileCopySchema, body) } : { kind: 'new' as const, ...parse(profileCreateSchema, body) };
}

/**
 * Cam profiles: the shop's library (job_id null) and the copies and new
 * profiles on each job. Builder and tech read; the builder writes.
 */
export function profilesRouter({ db, auth }: AppDeps) {
  const router = Router();

  router.get('/profiles', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ profiles: libraryProfiles(db, ctx.shop.id) });
  });

  router.post('/profiles', async (req, res) => {
    const body = parse(profileCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    res.status(201).json({ profile: createLibraryProfile(db, actorOf(ctx), body) });
  });

  router.get('/profiles/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ profile: loadProfile(db, ctx.shop.id, req.params.id) });
  });

  router.patch('/profiles/:id', async (req, res) => {
    const body = parse(profilePatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    res.json({ profile: updateProfile(db, actorOf(ctx), req.params.id, body) });
  });

  /** Removes a library profile. Job profiles stay with their job's record. */
  router.delete('/profiles/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    deleteLibraryProfile(db, actorOf(ctx), req.params.id);
    res.status(204).end();
  });

  router.get('/jobs/:jobId/profiles', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ profiles: jobProfiles(db, ctx.shop.id, req.params.jobId) });
  });

  /** Adds a profile to a job: a copy of a library profile (`fromProfileId`) or a new one. */
  router.post('/jobs/:jobId/profiles', async (req, res) => {
    const body = parseJobProfileBody(req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    res.status(201).json({ profile: addJobProfile(db, actorOf(ctx), req.params.jobId, body) });
  });

  return router;
}
