import { createHash, randomBytes } from 'node:crypto';

import { and, desc, eq, gt, isNull } from 'drizzle-orm';

import type { Db } from '@/db';
import { schema } from '@/db';
import { shareLinkLimits, type ShareLink } from '@/shared/owner';

import { conflict, notFound } from '../http';
import { audit } from './audit';
import type { Actor, AfterWrite, Reader } from './db';
import { jobVehicle, requireJob } from './jobs';

export type LinkRow = typeof schema.shareLinks.$inferSelect;

/** A new share token: 256 random bits, URL-safe. Only its hash is stored. */
export function newShareToken() {
  return randomBytes(shareLinkLimits.tokenBytes).toString('base64url');
}

export function hashShareToken(token: string) {
  return createHash('sha256').update(token).digest('hex');
}

export function linkState(row: Pick<LinkRow, 'revokedAt' | 'expiresAt'>, now = new Date()): ShareLink['state'] {
  if (row.revokedAt) return 'revoked';
  return row.expiresAt.getTime() <= now.getTime() ? 'expired' : 'active';
}

/** The link still opens the owner's page: not withdrawn, not expired. */
export const linkOpen = (row: Pick<LinkRow, 'revokedAt' | 'expiresAt'> | undefined): row is LinkRow => row !== undefined && linkState(row) === 'active';

export function toShareLink(row: LinkRow): ShareLink {
  return {
    id: row.id,
    state: linkState(row),
    email: row.email,
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
    revokedAt: row.revokedAt?.toISOString() ?? null,
    lastOpenedAt: row.lastOpenedAt?.toISOString() ?? null,
  };
}

type NewLink = { id?: string; shopId: string; jobId: string; email: string | null; days: number; createdBy: string | null };

/** Writes a share link with a fresh token; the token is returned this once and only its hash is stored. */
export function insertShareLink(tx: Pick<Db, 'insert'>, { id = crypto.randomUUID(), days, ...link }: NewLink) {
  const token = newShareToken();
  const expiresAt = new Date(Date.now() + days * 24 * 3600 * 1000);
  const row = tx
    .insert(schema.shareLinks)
    .values({ id, ...link, tokenHash: hashShareToken(token), expiresAt })
    .returning()
    .get();
  return { row, token };
}

/** The link a token opens (by its hash), whatever its state. */
export function linkByToken(db: Reader, token: string): LinkRow | undefined {
  return db
    .select()
    .from(schema.shareLinks)
    .where(eq(schema.shareLinks.tokenHash, hashShareToken(token)))
    .get();
}

export function linkById(db: Reader, id: string): LinkRow | undefined {
  return db.select().from(schema.shareLinks).where(eq(schema.shareLinks.id, id)).get();
}

/** Notes when the owner last opened the page. */
export function markOpened(db: Pick<Db, 'update'>, linkId: string) {
  db.update(schema.shareLinks).set({ lastOpenedAt: new Date() }).where(eq(schema.shareLinks.id, linkId)).run();
}

/** Open links of the shop sent to this e-mail, newest first. */
export function ownLinks(db: Reader, shopId: string, email: string): LinkRow[] {
  return db
    .select()
    .from(schema.shareLinks)
    .where(
      and(
        eq(schema.shareLinks.shopId, shopId),
        eq(schema.shareLinks.email, email.toLowerCase()),
        isNull(schema.shareLinks.revokedAt),
        gt(schema.shareLinks.expiresAt, new Date()),
      ),
    )
    .orderBy(desc(schema.shareLinks.createdAt))
    .all();
}

/** The job's links, newest first, for the builder. */
export function jobLinks(db: Reader, shopId: string, jobId: string): LinkRow[] {
  return db
    .select()
    .from(schema.shareLinks)
    .where(and(eq(schema.shareLinks.jobId, jobId), eq(schema.shareLinks.shopId, shopId)))
    .orderBy(desc(schema.shareLinks.createdAt))
    .all();
}

/**
 * The owner a link is e-mailed to also gets a customer account in the shop:
 * at once when someone already signed up with that address and verified it, otherwise
 * when the address is verified (a pending invitation, accepted by the user hook in server/auth.ts).
 * Someone already in the shop keeps their role.
 */
function inviteOwner(tx: Pick<Db, 'select' | 'insert'>, shopId: string, inviterId: string, email: string, expiresAt: Date) {
  const user = tx.select({ id: schema.users.id, emailVerified: schema.users.emailVerified }).from(schema.users).where(eq(schema.users.email, email)).get();
  if (user?.emailVerified) {
    tx.insert(schema.memberships).values({ id: crypto.randomUUID(), organizationId: shopId, userId: user.id, role: 'customer' }).onConflictDoNothing().run();
    return;
  }
  tx.insert(schema.invitations)
    .values({ id: crypto.randomUUID(), organizationId: shopId, email, role: 'customer', status: 'pending', expiresAt, inviterId })
    .run();
}

/** A new link, with its token (shown this once; only its hash is kept). */
export type CreatedShareLink = { link: ShareLink; token: string; expiresAt: Date; vehicle: string };

/** A new link to the job's owner page (the job must offer an option), inviting the address it is mailed to. */
export function createShareLink(
  db: Db,
  who: Actor,
  jobId: string,
  body: { email?: string | null; expiresInDays: number },
  after?: AfterWrite<CreatedShareLink>,
): CreatedShareLink {
  return db.transaction((tx) => {
    requireJob(tx, who.shopId, jobId);
    const hasOptions = tx.select({ id: schema.ownerOptions.id }).from(schema.ownerOptions).where(eq(schema.ownerOptions.jobId, jobId)).get();
    if (!hasOptions) throw conflict('Offer the owner at least one option before sharing the page');
    const made = insertShareLink(tx, { shopId: who.shopId, jobId, email: body.email ?? null, days: body.expiresInDays, createdBy: who.userId });
    const { row } = made;
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'create',
      entity: 'share-link',
      entityId: row.id,
      detail: { jobId, expiresAt: row.expiresAt.toISOString(), emailed: Boolean(body.email) },
    });
    if (body.email) inviteOwner(tx, who.shopId, who.userId, body.email, row.expiresAt);
    const created = { link: toShareLink(row), token: made.token, expiresAt: row.expiresAt, vehicle: jobVehicle(tx, jobId) ?? '' };
    after?.(tx, created);
    return created;
  });
}

/** Withdraws a link (once; withdrawing it again answers it as it is). */
export function revokeShareLink(db: Db, who: Actor, id: string): ShareLink {
  return db.transaction((tx) => {
    const row = tx
      .select()
      .from(schema.shareLinks)
      .where(and(eq(schema.shareLinks.id, id), eq(schema.shareLinks.shopId, who.shopId)))
      .get();
    if (!row) throw notFound('Share link');
    if (row.revokedAt) return toShareLink(row);
    const updated = tx.update(schema.shareLinks).set({ revokedAt: new Date() }).where(eq(schema.shareLinks.id, row.id)).returning().get();
    audit(tx, { shopId: who.shopId, userId: who.userId, action: 'revoke', entity: 'share-link', entityId: row.id, detail: { jobId: row.jobId } });
    return toShareLink(updated);
  });
}
