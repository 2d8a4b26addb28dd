import { and, asc, eq, isNull } from 'drizzle-orm';
import type { z } from 'zod';

import type { Db } from '@/db';
import { schema } from '@/db';
import type { Profile, profileCreateSchema, profilePatchSchema } from '@/shared/profile';

import { conflict, notFound } from '../http';
import { audit } from './audit';
import type { Actor, Reader } from './db';
import { requireJob } from './jobs';

type ProfileRow = typeof schema.camProfiles.$inferSelect;
type NewProfile = z.output<typeof profileCreateSchema>;

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

const inShop = (shopId: string, id: string) => and(eq(schema.camProfiles.id, id), eq(schema.camProfiles.shopId, shopId));

/** The shop's library (profiles on no job), by name. */
export function libraryProfiles(db: Reader, shopId: string): Profile[] {
  return db
    .select()
    .from(schema.camProfiles)
    .where(and(eq(schema.camProfiles.shopId, shopId), isNull(schema.camProfiles.jobId)))
    .orderBy(asc(schema.camProfiles.label), asc(schema.camProfiles.createdAt))
    .all()
    .map(toProfile);
}

/** The job's profiles in the order they were added; a 404 for another shop's job. */
export function jobProfiles(db: Reader, shopId: string, jobId: string): Profile[] {
  requireJob(db, shopId, jobId);
  return db
    .select()
    .from(schema.camProfiles)
    .where(and(eq(schema.camProfiles.shopId, shopId), eq(schema.camProfiles.jobId, jobId)))
    .orderBy(asc(schema.camProfiles.createdAt), asc(schema.camProfiles.id))
    .all()
    .map(toProfile);
}

export function loadProfile(db: Reader, shopId: string, id: string): Profile {
  const row = db.select().from(schema.camProfiles).where(inShop(shopId, id)).get();
  if (!row) throw notFound('Profile');
  return toProfile(row);
}

/** A profile of the job by id, in the shop (undefined when it is not one of the job's). */
export function findJobProfile(db: Reader, shopId: string, jobId: string, id: string) {
  return db
    .select()
    .from(schema.camProfiles)
    .where(and(inShop(shopId, id), eq(schema.camProfiles.jobId, jobId)))
    .get();
}

export function createLibraryProfile(db: Db, who: Actor, body: NewProfile): Profile {
  const row = db.transaction((tx) => {
    const created = tx
      .insert(schema.camProfiles)
      .values({ id: crypto.randomUUID(), shopId: who.shopId, jobId: null, createdBy: who.userId, ...body })
      .returning()
      .get();
    audit(tx, { shopId: who.shopId, userId: who.userId, action: 'create', entity: 'profile', entityId: created.id });
    return created;
  });
  return toProfile(row);
}

export function updateProfile(db: Db, who: Actor, id: string, { version, ...changes }: z.output<typeof profilePatchSchema>): Profile {
  const row = db.transaction((tx) => {
    const current = tx.select({ version: schema.camProfiles.version }).from(schema.camProfiles).where(inShop(who.shopId, id)).get();
    if (!current) throw notFound('Profile');
    if (current.version !== version) {
      throw conflict(
        `Someone saved this profile after you opened it (version ${current.version}, yours ${version}). Reload to see their changes, then edit again.`,
      );
    }
    const updated = tx
      .update(schema.camProfiles)
      .set({ ...changes, version: version + 1 })
      .where(and(inShop(who.shopId, id), eq(schema.camProfiles.version, version)))
      .returning()
      .get();
    if (!updated) throw conflict('This profile changed while saving. Reload and try again.');
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'update',
      entity: 'profile',
      entityId: id,
      detail: { fields: Object.keys(changes), version: updated.version },
    });
    return updated;
  });
  return toProfile(row);
}

/** Removes a library profile. Job profiles stay with their job's record (a 409). */
export function deleteLibraryProfile(db: Db, who: Actor, id: string) {
  db.transaction((tx) => {
    const current = tx
      .select({ jobId: schema.camProfiles.jobId, label: schema.camProfiles.label })
      .from(schema.camProfiles)
      .where(inShop(who.shopId, id))
      .get();
    if (!current) throw notFound('Profile');
    if (current.jobId !== null) {
      throw conflict('This profile belongs to a job and stays with its record. Only library profiles can be deleted.');
    }
    tx.delete(schema.camProfiles)
      .where(and(inShop(who.shopId, id), isNull(schema.camProfiles.jobId)))
      .run();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'delete',
      entity: 'profile',
      entityId: id,
      detail: { label: current.label },
    });
  });
}

/** What a new job profile starts from: a copy of a library profile, or values of its own. */
export type JobProfileSource = { kind: 'copy'; fromProfileId: string } | ({ kind: 'new' } & NewProfile);

/** Adds a profile to a job: a copy of a library profile (`fromProfileId`) or a new one. */
export function addJobProfile(db: Db, who: Actor, jobId: string, body: JobProfileSource): Profile {
  const row = db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    let values: Pick<ProfileRow, 'label' | 'coreNotes' | 'spec' | 'sourceProfileId'>;
    if (body.kind === 'copy') {
      const source = tx
        .select()
        .from(schema.camProfiles)
        .where(and(inShop(who.shopId, body.fromProfileId), isNull(schema.camProfiles.jobId)))
        .get();
      if (!source) throw notFound('Library profile');
      values = { label: source.label, coreNotes: source.coreNotes, spec: source.spec, sourceProfileId: source.id };
    } else {
      values = { label: body.label, coreNotes: body.coreNotes, spec: body.spec, sourceProfileId: null };
    }
    const created = tx
      .insert(schema.camProfiles)
      .values({ id: crypto.randomUUID(), shopId: who.shopId, jobId, createdBy: who.userId, ...values })
      .returning()
      .get();
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: body.kind === 'copy' ? 'copy' : 'create',
      entity: 'profile',
      entityId: created.id,
      detail: { jobId, ...(values.sourceProfileId ? { sourceProfileId: values.sourceProfileId } : {}) },
    });
    return created;
  });
  return toProfile(row);
}
