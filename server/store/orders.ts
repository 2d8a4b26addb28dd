import { and, asc, desc, eq, inArray, isNotNull, isNull, lt, not, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { z } from 'zod';

import type { Db } from '@/db';
import { schema } from '@/db';
import { revisionChecksum } from '@/shared/checksum';
import {
  confirmableStages,
  firmOnlyStage,
  orderMoves,
  orderIsLive,
  orderStageLabels,
  underWayStages,
  type issueSchema,
  type Order,
  type OrderDetail,
  type OrderEvent,
  type OrderMessage,
  type orderMoveSchema,
  type OrderStage,
} from '@/shared/orders';
import { roleAllows, type ShopKind, type ShopRole } from '@/shared/roles';

import { conflict, forbidden, HttpError, notFound } from '../http';
import type { PageRequest } from '../paging';
import { audit } from './audit';
import type { Actor, AfterWrite, Reader, Writer } from './db';
import { loadApproval, withdrawApproval } from './owner-page';
import { approvedRevisionId, issueTarget, revisionWithSupersession } from './sheets';

type Side = 'builder' | 'grinder';

/** Who is looking at an order: their active shop and role there (the access layer's InShop fits). */
export type OrderViewer = { shop: { id: string; kind: ShopKind }; user: { id: string }; role: ShopRole };

const repairShops = alias(schema.shops, 'repair_shops');
const grinderShops = alias(schema.shops, 'grinder_shops');

/** The first revision of the order's sheet issued after the order's own (the one that supersedes it), as `column`. */
const supersedingRevision = <T>(column: 'number' | 'issued_at') =>
  sql<T | null>`(select later.${sql.raw(column)} from ${schema.sheetRevisions} later where later.sheet_id = ${schema.grindOrders.sheetId} and later.state = 'issued' and later.number > ${schema.sheetRevisions.number} order by later.number limit 1)`;

/**
 * Orders the grinder still works on: the revision is live, or the grinding had begun before a later revision
 * was issued (`orderIsLive` in shared/orders.ts says the same of one order).
 */
const liveOrders = or(
  not(
    sql`exists (select 1 from ${schema.sheetRevisions} later where later.sheet_id = ${schema.grindOrders.sheetId} and later.state = 'issued' and later.number > ${schema.sheetRevisions.number})`,
  ),
  inArray(schema.grindOrders.stage, [...underWayStages]),
);

/**
 * The job's firm order on a revision no later issue has superseded, on any of its sheets, or undefined. A job has at
 * most one: issuing, confirming and approving each refuse a second. A firm order superseded while under way is no
 * longer it: it stays on the grinder's list, flagged for both shops to settle (SupersededNotice).
 */
export function liveFirmOrder(db: Reader, jobId: string): Order | undefined {
  const sheets = db.select({ id: schema.specSheets.id }).from(schema.specSheets).where(eq(schema.specSheets.jobId, jobId));
  return selectOrders(db, and(inArray(schema.grindOrders.sheetId, sheets), isNotNull(schema.grindOrders.firmBy))).find((o) => o.supersededBy === null);
}

/** One order by id, as selectOrders reads it, for a row this transaction has just written. */
function writtenOrder(tx: Reader, id: string): Order {
  const [order] = selectOrders(tx, eq(schema.grindOrders.id, id));
  if (!order) throw new Error(`Order ${id} was not written`);
  return order;
}

/** The 409 when a builder gives a reason to go ahead without the owner, on a job the owner has approved. */
const approvedNeedsNoConfirmation = () =>
  conflict('The owner approved an option on this job: the firm order is the approved revision, and needs no confirmation.');

/** The order on an issued revision (one per revision), or undefined. */
export function orderOfRevision(db: Reader, revisionId: string): Order | undefined {
  return selectOrders(db, eq(schema.grindOrders.revisionId, revisionId))[0];
}

/** The 409 when the job already has a firm order on another revision. */
export function secondFirmOrder(firm: Order): HttpError {
  return new HttpError(
    409,
    'firm_order_exists',
    `Revision ${firm.revisionNumber} of “${firm.sheetTitle}” is already this job’s firm order with ${firm.grinderShop.name}. A job grinds one revision: ask for quotes on others, but confirm only one.`,
  );
}

/** Makes an order the job's firm order, in the caller's transaction, with its audit row; answers the order as it now is. */
export function makeFirm(
  tx: Writer,
  who: { shopId: string; userId: string | null },
  orderId: string,
  firm: { by: 'owner' | 'builder'; reason: string | null },
) {
  const row = tx
    .update(schema.grindOrders)
    .set({ firmBy: firm.by, firmAt: new Date(), firmReason: firm.reason, version: sql`${schema.grindOrders.version} + 1` })
    .where(and(eq(schema.grindOrders.id, orderId), isNull(schema.grindOrders.firmBy)))
    .returning({ version: schema.grindOrders.version })
    .get();
  if (!row) throw conflict('This order was confirmed while you were confirming it. Reload to see it.');
  audit(tx, {
    shopId: who.shopId,
    userId: who.userId,
    action: 'confirm',
    entity: 'order',
    entityId: orderId,
    detail: { by: firm.by, reason: firm.reason, version: row.version },
  });
  return writtenOrder(tx, orderId);
}

/** Orders with their sheet, revision and both shops' names, filtered by `where` (which carries the shop scope). */
export function selectOrders(db: Reader, where: SQL | undefined): Order[] {
  return selectOrderRows(db, where).map((r) => r.order);
}

/**
 * selectOrders with each order's creation time (milliseconds), the sort key of a page.
 * With `page`, one keyset page newest first on (created_at, id), reading one row more than the limit.
 */
export function selectOrderRows(db: Reader, where: SQL | undefined, page?: PageRequest): { order: Order; createdAt: number }[] {
  const { grindOrders } = schema;
  const after = page?.after;
  const from = after
    ? or(lt(grindOrders.createdAt, new Date(after.at)), and(eq(grindOrders.createdAt, new Date(after.at)), lt(grindOrders.id, after.id)))
    : undefined;
  const rows = db
    .select({
      order: schema.grindOrders,
      sheetTitle: schema.specSheets.title,
      revisionNumber: schema.sheetRevisions.number,
      issuedAt: schema.sheetRevisions.issuedAt,
      repairShopName: repairShops.name,
      grinderShopName: grinderShops.name,
      supersededNumber: supersedingRevision<number>('number'),
      supersededAt: supersedingRevision<number>('issued_at'),
    })
    .from(schema.grindOrders)
    .innerJoin(schema.specSheets, eq(schema.specSheets.id, schema.grindOrders.sheetId))
    .innerJoin(schema.sheetRevisions, eq(schema.sheetRevisions.id, schema.grindOrders.revisionId))
    .innerJoin(repairShops, eq(repairShops.id, schema.grindOrders.repairShopId))
    .innerJoin(grinderShops, eq(grinderShops.id, schema.grindOrders.grinderShopId))
    .where(and(where, from))
    .orderBy(
      ...(page ? [desc(grindOrders.createdAt), desc(grindOrders.id)] : [desc(grindOrders.createdAt), desc(schema.sheetRevisions.number), asc(grindOrders.id)]),
    )
    .limit(page ? page.limit + 1 : -1)
    .all();
  return rows.map(({ order, ...r }) => ({
    createdAt: order.createdAt.getTime(),
    order: {
      id: order.id,
      sheetId: order.sheetId,
      sheetTitle: r.sheetTitle,
      revisionId: order.revisionId,
      revisionNumber: r.revisionNumber,
      checksum: order.checksum,
      repairShop: { id: order.repairShopId, name: r.repairShopName },
      grinderShop: { id: order.grinderShopId, name: r.grinderShopName },
      stage: order.stage,
      quote: order.quote ?? null,
      shipping: order.shipping ?? null,
      issuedAt: (r.issuedAt ?? order.createdAt).toISOString(),
      updatedAt: order.updatedAt.toISOString(),
      version: order.version,
      supersededBy: r.supersededNumber !== null && r.supersededAt !== null ? { number: r.supersededNumber, at: new Date(r.supersededAt).toISOString() } : null,
      firm: order.firmBy && order.firmAt ? { by: order.firmBy, at: order.firmAt.toISOString(), reason: order.firmReason ?? null } : null,
    },
  }));
}

/**
 * Which side of the order the person stands on, from their active shop: the repair shop's
 * readers (job read) or the grinding shop's grinders. Anyone else gets a 404, as if the order did not exist.
 */
export function requireOrder(db: Reader, ctx: OrderViewer, id: string): { order: Order; side: Side } {
  const asRepair = ctx.shop.kind === 'repair' && roleAllows(ctx.role, { job: ['read'] });
  const asGrinder = ctx.shop.kind === 'grinding' && ctx.role === 'grinder';
  if (!asRepair && !asGrinder) throw notFound('Order');
  const scope = asRepair ? eq(schema.grindOrders.repairShopId, ctx.shop.id) : eq(schema.grindOrders.grinderShopId, ctx.shop.id);
  const [order] = selectOrders(db, and(eq(schema.grindOrders.id, id), scope));
  if (!order) throw notFound('Order');
  return { order, side: asRepair ? 'builder' : 'grinder' };
}

export function loadMessages(db: Reader, order: Order): OrderMessage[] {
  return db
    .select({
      id: schema.orderMessages.id,
      body: schema.orderMessages.body,
      createdAt: schema.orderMessages.createdAt,
      authorId: schema.orderMessages.authorUserId,
      authorName: schema.users.name,
      shopId: schema.orderMessages.authorShopId,
      shopName: schema.shops.name,
    })
    .from(schema.orderMessages)
    .innerJoin(schema.shops, eq(schema.shops.id, schema.orderMessages.authorShopId))
    .leftJoin(schema.users, eq(schema.users.id, schema.orderMessages.authorUserId))
    .where(eq(schema.orderMessages.orderId, order.id))
    .orderBy(asc(schema.orderMessages.createdAt), asc(schema.orderMessages.id))
    .all()
    .map((m) => ({
      id: m.id,
      orderId: order.id,
      body: m.body,
      author: {
        id: m.authorId,
        name: m.authorName ?? 'A former member',
        shopName: m.shopName,
        side: m.shopId === order.grinderShop.id ? 'grinder' : 'builder',
      },
      createdAt: m.createdAt.toISOString(),
    }));
}

/** The order's audit rows, oldest first: its issue, moves, messages and supersession, with who did each. */
export function orderEvents(db: Reader, orderId: string): OrderEvent[] {
  return db
    .select({
      id: schema.auditLog.id,
      action: schema.auditLog.action,
      by: schema.users.name,
      at: schema.auditLog.createdAt,
      detail: schema.auditLog.detail,
    })
    .from(schema.auditLog)
    .leftJoin(schema.users, eq(schema.users.id, schema.auditLog.userId))
    .where(and(eq(schema.auditLog.entity, 'order'), eq(schema.auditLog.entityId, orderId)))
    .orderBy(asc(schema.auditLog.id))
    .all()
    .map((e) => ({ id: e.id, action: e.action, by: e.by ?? 'A former member', at: e.at.toISOString(), detail: e.detail ?? null }));
}

export function loadDetail(db: Reader, order: Order): OrderDetail {
  const revision = revisionWithSupersession(db, order.revisionId);
  if (!revision) throw new Error(`Order ${order.id} has no revision`);
  const job = db
    .select({ vehicle: schema.jobs.vehicle })
    .from(schema.specSheets)
    .innerJoin(schema.jobs, eq(schema.jobs.id, schema.specSheets.jobId))
    .where(eq(schema.specSheets.id, order.sheetId))
    .get();
  return { ...order, revision, vehicle: job?.vehicle ?? '', messages: loadMessages(db, order), events: orderEvents(db, order.id) };
}

/** "From sent: the grinder can move it to quoted or changes-asked." */
export function allowedMovesText(stage: OrderStage): string {
  const moves = orderMoves[stage];
  if (!moves.length) return `Nothing can follow ${stage}.`;
  return `From ${stage} only ${moves.map((m) => `the ${m.by} can move it to ${m.to}`).join(', or ')}.`;
}

/** Fields that belong to one move only. */
const moveFields = { quote: 'quoted', shipping: 'shipped' } as const;

/** The grinding shops a sheet can be issued to, by name. */
export function grindingShops(db: Reader) {
  return db
    .select({ id: schema.shops.id, name: schema.shops.name })
    .from(schema.shops)
    .where(eq(schema.shops.kind, 'grinding'))
    .orderBy(asc(schema.shops.name), asc(schema.shops.id))
    .all();
}

/** The sheet's orders (a 404 for another shop's sheet). */
export function sheetOrders(db: Reader, shopId: string, sheetId: string): Order[] {
  const sheet = db
    .select({ id: schema.specSheets.id })
    .from(schema.specSheets)
    .where(and(eq(schema.specSheets.id, sheetId), eq(schema.specSheets.shopId, shopId)))
    .get();
  if (!sheet) throw notFound('Spec sheet');
  return selectOrders(db, and(eq(schema.grindOrders.sheetId, sheet.id), eq(schema.grindOrders.repairShopId, shopId)));
}

/**
 * One page of a grinding shop's live incoming orders, newest first, with one row more than the limit when there are more.
 * An order whose revision a later issue superseded before the grinding began is closed and left off.
 */
export function incomingRows(db: Reader, grinderShopId: string, page: PageRequest) {
  return selectOrderRows(db, and(eq(schema.grindOrders.grinderShopId, grinderShopId), liveOrders), page);
}

/**
 * Issues the sheet's revision to send (issueTarget: the approved one, else the latest draft) to a grinding shop: one UPDATE flips it to issued, and
 * the order starts at `sent` with the note as the thread's first message, audited on the sheet and the order.
 */
/**
 * Issues the sheet's revision to be ground (see issueTarget) to a grinding shop. `after` runs in the same
 * transaction with the new order and the earlier orders on the sheet that it supersedes.
 */
export function issueSheet(
  db: Db,
  who: Actor,
  sheetId: string,
  body: z.output<typeof issueSchema>,
  after?: (tx: Writer, issued: Order, superseded: Order[], withdrawn: ReturnType<typeof withdrawApproval>) => void,
): Order {
  return db.transaction((tx) => {
    const sheet = tx
      .select()
      .from(schema.specSheets)
      .where(and(eq(schema.specSheets.id, sheetId), eq(schema.specSheets.shopId, who.shopId)))
      .get();
    if (!sheet) throw notFound('Spec sheet');
    const revisions = tx
      .select()
      .from(schema.sheetRevisions)
      .where(eq(schema.sheetRevisions.sheetId, sheetId))
      .orderBy(asc(schema.sheetRevisions.number))
      .all();
    const approvedId = approvedRevisionId(tx, sheet.jobId);
    const target = issueTarget(revisions, approvedId);
    if ('blocked' in target) throw conflict(target.blocked);
    const revision = target.row;
    // The job's one firm order before this issue: on this sheet the issue supersedes it (once grinding began, not while
    // the owner's approval stands on it); on another sheet it stays the job's, so this issue cannot be firm too.
    const firmBefore = liveFirmOrder(tx, sheet.jobId);
    if (target.replacesApproved !== null && firmBefore && underWayStages.includes(firmBefore.stage)) {
      throw conflict(
        `Grinding has begun on revision ${firmBefore.revisionNumber}, the one the owner approved (${orderStageLabels[firmBefore.stage].toLowerCase()}). Agree with ${firmBefore.grinderShop.name} whether it stops before you issue another revision.`,
      );
    }
    if (sheet.version !== body.version) {
      throw conflict(
        `Someone saved this spec sheet after you opened it (version ${sheet.version}, yours ${body.version}). Reload and check the revision before you issue it.`,
      );
    }
    const grinder = tx
      .select({ id: schema.shops.id })
      .from(schema.shops)
      .where(and(eq(schema.shops.id, body.grinderShopId), eq(schema.shops.kind, 'grinding')))
      .get();
    if (!grinder) {
      throw new HttpError(400, 'invalid', 'grinderShopId: Choose one of the grinding shops', {
        grinderShopId: 'Choose one of the grinding shops',
      });
    }
    const issuedAt = new Date();
    // One UPDATE flips the draft to issued; after it, the trigger keeps the row as it is for good.
    const issued = tx
      .update(schema.sheetRevisions)
      .set({ state: 'issued', issuedAt, issuedToShopId: grinder.id })
      .where(and(eq(schema.sheetRevisions.id, revision.id), eq(schema.sheetRevisions.state, 'draft')))
      .returning()
      .get();
    if (!issued) throw conflict('This revision was issued while you were sending it. Reload to see it.');
    const checksum = revisionChecksum(issued);
    const id = crypto.randomUUID();
    // Superseding the approved revision before grinding withdraws the approval: the owner is asked again.
    const withdrawn =
      target.replacesApproved === null
        ? undefined
        : withdrawApproval(
            tx,
            who,
            sheet.jobId,
            `Revision ${issued.number} of “${sheet.title}” replaced revision ${target.replacesApproved}, the one approved, before grinding began.`,
          );
    // Firm from the start: the owner's approved revision, or the builder's confirmation with its reason.
    const firm = target.approved ? { by: 'owner' as const, reason: null } : body.confirm ? { by: 'builder' as const, reason: body.confirm.reason } : null;
    // The approval read above still stands unless this issue withdrew it.
    if (body.confirm && approvedId !== null && withdrawn === undefined) throw approvedNeedsNoConfirmation();
    // On this sheet, the issue supersedes the firm order it had; on another sheet, that one stays the job's.
    if (firm && firmBefore && firmBefore.sheetId !== sheetId) throw secondFirmOrder(firmBefore);
    tx.insert(schema.grindOrders)
      .values({
        id,
        repairShopId: who.shopId,
        grinderShopId: grinder.id,
        sheetId,
        revisionId: issued.id,
        checksum,
        stage: 'sent',
        issuedBy: who.userId,
        ...(firm ? { firmBy: firm.by, firmAt: issuedAt, firmReason: firm.reason } : {}),
      })
      .run();
    if (body.note) {
      tx.insert(schema.orderMessages)
        .values({ id: crypto.randomUUID(), orderId: id, authorUserId: who.userId, authorShopId: who.shopId, body: body.note })
        .run();
    }
    const bumped = tx
      .update(schema.specSheets)
      .set({ version: body.version + 1 })
      .where(and(eq(schema.specSheets.id, sheetId), eq(schema.specSheets.version, body.version)))
      .returning()
      .get();
    if (!bumped) throw conflict('This spec sheet changed while issuing. Reload and try again.');
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'issue',
      entity: 'sheet',
      entityId: sheetId,
      detail: { revision: issued.number, orderId: id, grinderShopId: grinder.id, checksum, version: bumped.version },
    });
    audit(tx, {
      shopId: who.shopId,
      userId: who.userId,
      action: 'issue',
      entity: 'order',
      entityId: id,
      detail: { to: 'sent', revision: issued.number, checksum, firm: firm?.by ?? null, ...(firm?.reason ? { reason: firm.reason } : {}) },
    });
    // Every earlier order on this sheet now holds a superseded revision: say so in its own history.
    const earlier = tx
      .select({ id: schema.grindOrders.id, stage: schema.grindOrders.stage, number: schema.sheetRevisions.number })
      .from(schema.grindOrders)
      .innerJoin(schema.sheetRevisions, eq(schema.sheetRevisions.id, schema.grindOrders.revisionId))
      .where(and(eq(schema.grindOrders.sheetId, sheetId), lt(schema.sheetRevisions.number, issued.number)))
      .all();
    for (const old of earlier) {
      audit(tx, {
        shopId: who.shopId,
        userId: who.userId,
        action: 'supersede',
        entity: 'order',
        entityId: old.id,
        detail: { revision: old.number, by: issued.number, stage: old.stage, closed: !underWayStages.includes(old.stage) },
      });
    }
    const created = writtenOrder(tx, id);
    // The orders this issue supersedes for the first time (an older one was superseded by an earlier issue already).
    const superseded = earlier.length
      ? selectOrders(
          tx,
          inArray(
            schema.grindOrders.id,
            earlier.map((o) => o.id),
          ),
        ).filter((o) => o.supersededBy?.number === issued.number)
      : [];
    after?.(tx, created, superseded, withdrawn);
    return created;
  });
}

/** Moves an order one stage on `orderMoves`, by the side allowed to, with the move's own field. */
export function moveOrder(
  db: Db,
  who: OrderViewer,
  id: string,
  body: z.output<typeof orderMoveSchema>,
  after?: AfterWrite<{ order: Order; message: string | null }>,
): { order: Order; message: string | null } {
  return db.transaction((tx) => {
    const { order: current, side: viewSide } = requireOrder(tx, who, id);
    // Reading is wider than moving: a tech sees the order but moves nothing.
    const side: Side | null = viewSide === 'grinder' ? 'grinder' : who.role === 'builder' ? 'builder' : null;
    if (!side) throw forbidden('Only a builder or the grinder can move an order');
    if (current.version !== body.version) {
      throw conflict(
        `This order changed after you opened it (version ${current.version}, yours ${body.version}); it is now ${orderStageLabels[current.stage].toLowerCase()}. Reload and try again.`,
      );
    }
    if (!orderIsLive(current) && current.supersededBy) {
      throw new HttpError(
        409,
        'superseded',
        `Revision ${current.revisionNumber} of “${current.sheetTitle}” was superseded by revision ${current.supersededBy.number} before grinding began, so this order cannot be quoted or moved. Work from revision ${current.supersededBy.number}.`,
      );
    }
    if (body.to === firmOnlyStage && !current.firm) {
      throw new HttpError(
        409,
        'not_firm',
        `Revision ${current.revisionNumber} of “${current.sheetTitle}” is a request for a quote, not a firm order: grind it only once the owner approves it or ${current.repairShop.name} confirms it.`,
      );
    }
    const move = orderMoves[current.stage].find((m) => m.to === body.to);
    if (!move || move.by !== side) {
      const reason = move ? `only the ${move.by} can move it to ${body.to}` : `it cannot go to ${body.to}`;
      throw new HttpError(409, 'illegal_move', `This order is ${current.stage}, so ${reason}. ${allowedMovesText(current.stage)}`);
    }
    const fields: Record<string, string> = {};
    if (body.to === 'quoted' && !body.quote) fields.quote = 'Enter the price and lead time to quote';
    if (body.to === 'changes-asked' && !body.message) fields.message = 'Say what needs to change';
    if (body.to === 'shipped' && !body.shipping) fields.shipping = 'Enter the carrier and tracking text to ship';
    for (const [field, to] of Object.entries(moveFields)) {
      if (body[field as keyof typeof moveFields] && body.to !== to) fields[field] = `Only a move to ${to} takes ${field}`;
    }
    const [first] = Object.entries(fields);
    if (first) throw new HttpError(400, 'invalid', `${first[0]}: ${first[1]}`, fields);

    const moved = tx
      .update(schema.grindOrders)
      .set({
        stage: body.to,
        version: body.version + 1,
        ...(body.quote ? { quote: body.quote } : {}),
        ...(body.shipping ? { shipping: body.shipping } : {}),
      })
      .where(and(eq(schema.grindOrders.id, id), eq(schema.grindOrders.version, body.version)))
      .returning()
      .get();
    if (!moved) throw conflict('This order changed while saving. Reload and try again.');
    if (body.message) {
      tx.insert(schema.orderMessages)
        .values({ id: crypto.randomUUID(), orderId: id, authorUserId: who.user.id, authorShopId: who.shop.id, body: body.message })
        .run();
    }
    audit(tx, {
      shopId: who.shop.id,
      userId: who.user.id,
      action: 'move',
      entity: 'order',
      entityId: id,
      detail: {
        from: current.stage,
        to: body.to,
        ...(body.quote ? { quote: body.quote } : {}),
        ...(body.shipping ? { shipping: body.shipping } : {}),
        version: moved.version,
      },
    });
    const updated = writtenOrder(tx, id);
    const answer = { order: updated, message: body.message ?? null };
    after?.(tx, answer);
    return answer;
  });
}

/** Adds a message to the order's thread. */
export function addOrderMessage(db: Db, who: OrderViewer, orderId: string, body: { body: string }): OrderMessage {
  return db.transaction((tx) => {
    const { order } = requireOrder(tx, who, orderId);
    const id = crypto.randomUUID();
    tx.insert(schema.orderMessages).values({ id, orderId: order.id, authorUserId: who.user.id, authorShopId: who.shop.id, body: body.body }).run();
    audit(tx, { shopId: who.shop.id, userId: who.user.id, action: 'message', entity: 'order_message', entityId: id, detail: { orderId: order.id } });
    const written = loadMessages(tx, order).find((m) => m.id === id);
    if (!written) throw new Error(`Message ${id} was not written`);
    return written;
  });
}

/**
 * A builder makes a request for a quote the job's firm order without the owner's approval, with the reason kept on the
 * order and in its audit row. Refused when the owner approved an option (that revision is the firm order), when the
 * job already has a firm order, and on a closed or changes-asked order.
 */
export function confirmOrder(db: Db, who: OrderViewer, id: string, body: { version: number; reason: string }, after?: AfterWrite<Order>): Order {
  return db.transaction((tx) => {
    const { order: current, side } = requireOrder(tx, who, id);
    if (side !== 'builder' || who.role !== 'builder') throw forbidden('Only a builder of the repair shop can confirm an order');
    if (current.version !== body.version) {
      throw conflict(`This order changed after you opened it (version ${current.version}, yours ${body.version}). Reload and try again.`);
    }
    if (current.firm) throw conflict('This order is already the firm order.');
    if (!orderIsLive(current)) throw conflict(`Revision ${current.revisionNumber} was superseded: confirm the order on the latest revision instead.`);
    if (!confirmableStages.includes(current.stage)) {
      throw conflict(`This order is ${orderStageLabels[current.stage].toLowerCase()}: only a sent or quoted request can be confirmed.`);
    }
    const jobId = tx.select({ jobId: schema.specSheets.jobId }).from(schema.specSheets).where(eq(schema.specSheets.id, current.sheetId)).get()?.jobId;
    if (!jobId) throw notFound('Order');
    if (loadApproval(tx, jobId)) throw approvedNeedsNoConfirmation();
    const firm = liveFirmOrder(tx, jobId);
    if (firm) throw secondFirmOrder(firm);
    const confirmed = makeFirm(tx, { shopId: who.shop.id, userId: who.user.id }, id, { by: 'builder', reason: body.reason });
    after?.(tx, confirmed);
    return confirmed;
  });
}
