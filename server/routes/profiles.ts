import { Router } from 'express';
import { and, asc, eq, isNull } from 'drizzle-orm';

import { schema } from '@/db';
import { profileCopySchema, profileCreateSchema, profilePatchSchema, type Profile } from '@/shared/profile';

import { requireShopRole } from '../access';
import { audit } from '../audit';
import type { AppDeps } from '../deps';
import { conflict, notFound, parse } from '../http';
import { requireJob } from '../scope';

type ProfileRow = typeof schema.camProfiles.$inferSelect;

export function toProfile(row: ProfileRow): Profile {
  return {
    id: row.id,
    shopId: row.shopId,
    jobId: row.jobId,
    sourceProfileId: row.sourceProfileId,
    label: row.label,
    coreNotes: row.coreNotes,
    spec: row.spec,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** A job-profile body either copies a library profile or writes a new one. */
function parseJobProfileBody(body: unknown) {
  const copy = typeof body === 'object' && body !== null && 'fromProfileId' in body;
  return copy
    ? { kind: 'copy' as const, ...parse(profileCopySchema, body) }
    : { kind: 'new' as const, ...parse(profileCreateSchema, body) };
}

/**
 * Cam profiles: the shop's library (job_id null) and the copies and new
 * profiles on each job. Builder and tech read; the builder writes.
 */
export function profilesRouter({ db, auth }: AppDeps) {
  const router = Router();

  const inShop = (shopId: string, id: string) => and(eq(schema.camProfiles.id, id), eq(schema.camProfiles.shopId, shopId));

  router.get('/profiles', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    const rows = db
      .select()
      .from(schema.camProfiles)
      .where(and(eq(schema.camProfiles.shopId, ctx.shop.id), isNull(schema.camProfiles.jobId)))
      .orderBy(asc(schema.camProfiles.label), asc(schema.camProfiles.createdAt))
      .all();
    res.json({ profiles: rows.map(toProfile) });
  });

  router.post('/profiles', async (req, res) => {
    const body = parse(profileCreateSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const row = db.transaction((tx) => {
      const created = tx
        .insert(schema.camProfiles)
        .values({ id: crypto.randomUUID(), shopId: ctx.shop.id, jobId: null, createdBy: ctx.user.id, ...body })
        .returning()
        .get();
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'create', entity: 'profile', entityId: created.id });
      return created;
    });
    res.status(201).json({ profile: toProfile(row) });
  });

  router.get('/profiles/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    const row = db.select().from(schema.camProfiles).where(inShop(ctx.shop.id, req.params.id)).get();
    if (!row) throw notFound('Profile');
    res.json({ profile: toProfile(row) });
  });

  router.patch('/profiles/:id', async (req, res) => {
    const { version, ...changes } = parse(profilePatchSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const id = req.params.id;
    const row = db.transaction((tx) => {
      const current = tx.select({ version: schema.camProfiles.version }).from(schema.camProfiles).where(inShop(ctx.shop.id, id)).get();
      if (!current) throw notFound('Profile');
      if (current.version !== version) {
        throw conflict(
          `Someone saved this profile after you opened it (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
        );
      }
      const updated = tx
        .update(schema.camProfiles)
        .set({ ...changes, version: version + 1 })
        .where(and(inShop(ctx.shop.id, id), eq(schema.camProfiles.version, version)))
        .returning()
        .get();
      if (!updated) throw conflict('This profile changed while saving. Reload and try again.');
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'update',
        entity: 'profile',
        entityId: id,
        detail: { fields: Object.keys(changes), version: updated.version },
      });
      return updated;
    });
    res.json({ profile: toProfile(row) });
  });

  /** Removes a library profile. Job profiles stay with their job's record. */
  router.delete('/profiles/:id', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const id = req.params.id;
    db.transaction((tx) => {
      const current = tx
        .select({ jobId: schema.camProfiles.jobId, label: schema.camProfiles.label })
        .from(schema.camProfiles)
        .where(inShop(ctx.shop.id, id))
        .get();
      if (!current) throw notFound('Profile');
      if (current.jobId !== null) {
        throw conflict('This profile belongs to a job and stays with its record. Only library profiles can be deleted.');
      }
      tx.delete(schema.camProfiles).where(and(inShop(ctx.shop.id, id), isNull(schema.camProfiles.jobId))).run();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: 'delete',
        entity: 'profile',
        entityId: id,
        detail: { label: current.label },
      });
    });
    res.status(204).end();
  });

  router.get('/jobs/:jobId/profiles', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    requireJob(db, ctx.shop.id, req.params.jobId);
    const rows = db
      .select()
      .from(schema.camProfiles)
      .where(and(eq(schema.camProfiles.shopId, ctx.shop.id), eq(schema.camProfiles.jobId, req.params.jobId)))
      .orderBy(asc(schema.camProfiles.createdAt), asc(schema.camProfiles.id))
      .all();
    res.json({ profiles: rows.map(toProfile) });
  });

  /** Adds a profile to a job: a copy of a library profile (`fromProfileId`) or a new one. */
  router.post('/jobs/:jobId/profiles', async (req, res) => {
    const body = parseJobProfileBody(req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['write'] });
    const jobId = req.params.jobId;
    const row = db.transaction((tx) => {
      requireJob(tx, ctx.shop.id, jobId);
      let values: Pick<ProfileRow, 'label' | 'coreNotes' | 'spec' | 'sourceProfileId'>;
      if (body.kind === 'copy') {
        const source = tx
          .select()
          .from(schema.camProfiles)
          .where(and(inShop(ctx.shop.id, body.fromProfileId), isNull(schema.camProfiles.jobId)))
          .get();
        if (!source) throw notFound('Library profile');
        values = { label: source.label, coreNotes: source.coreNotes, spec: source.spec, sourceProfileId: source.id };
      } else {
        values = { label: body.label, coreNotes: body.coreNotes, spec: body.spec, sourceProfileId: null };
      }
      const created = tx
        .insert(schema.camProfiles)
        .values({ id: crypto.randomUUID(), shopId: ctx.shop.id, jobId, createdBy: ctx.user.id, ...values })
        .returning()
        .get();
      audit(tx, {
        shopId: ctx.shop.id,
        userId: ctx.user.id,
        action: body.kind === 'copy' ? 'copy' : 'create',
        entity: 'profile',
        entityId: created.id,
        detail: { jobId, ...(values.sourceProfileId ? { sourceProfileId: values.sourceProfileId } : {}) },
      });
      return created;
    });
    res.status(201).json({ profile: toProfile(row) });
  });

  return router;
}
