import { Router } from 'express';

import { issueSchema, messageSchema, orderMoveSchema, orderStageLabels, underWayStages, type Order, type OrderStage } from '@/shared/orders';

import { actorOf, requireMember, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { forbidden, parse } from '../http';
import { queueEach } from '../mail';
import { orderMail, type OrderMailFacts, type OrderMailKind } from '../mail/order-mail';
import { pageRequest, toPage } from '../paging';
import { addOrderMessage, grindingShops, incomingRows, issueSheet, loadDetail, loadMessages, moveOrder, requireOrder, sheetOrders } from '../store/orders';
import type { Writer } from '../store/db';
import { recipients } from '../store/team';

/** Stages in which the cam is still with the grinder: a superseded order there is mailed to the grinding shop. */
const grinderHoldsStages: readonly OrderStage[] = ['sent', 'quoted', 'grinding'];

/**
 * Grind orders: a builder issues a sheet's draft revision to a grinding shop; both
 * shops then move the order through the stages in shared/orders.ts, and talk in its thread.
 */
export function ordersRouter({ db, auth, mailer, publicUrl }: AppDeps) {
  const router = Router();

  /** Queues order mail in the transaction of the move it tells of: to the grinders on issue and supersession, else to the builders. */
  function queueOrderMail(tx: Writer, kind: OrderMailKind, order: Order, extra: Pick<OrderMailFacts, 'message' | 'superseded'> = {}) {
    const toGrinders = kind === 'issued' || kind === 'superseded';
    const shop = toGrinders ? order.grinderShop : order.repairShop;
    const to = recipients(tx, shop.id, toGrinders ? 'grinder' : 'builder');
    const facts: OrderMailFacts = {
      orderId: order.id,
      publicUrl,
      sheetTitle: order.sheetTitle,
      revisionNumber: order.revisionNumber,
      checksum: order.checksum,
      repairShopName: order.repairShop.name,
      grinderShopName: order.grinderShop.name,
      quote: order.quote,
      shipping: order.shipping,
      ...extra,
    };
    queueEach(mailer, tx, to, (person) => orderMail(kind, person, facts), shop.id);
  }

  router.get('/grinding-shops', async (req, res) => {
    await requireShopRole(auth, db, req, { sheet: ['issue'] });
    res.json({ shops: grindingShops(db) });
  });

  router.post('/sheets/:id/issue', async (req, res) => {
    const body = parse(issueSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['issue'] });
    const order = issueSheet(db, actorOf(ctx), req.params.id, body, (tx, issued, superseded) => {
      queueOrderMail(tx, 'issued', issued, { message: body.note || null });
      // The grinder of each order this supersedes hears of it while the work is still in their hands.
      for (const old of superseded.filter((o) => grinderHoldsStages.includes(o.stage))) {
        const underWay = underWayStages.includes(old.stage);
        queueOrderMail(tx, 'superseded', old, { superseded: { by: issued.revisionNumber, stageLabel: orderStageLabels[old.stage], underWay } });
      }
    });
    res.status(201).json({ order });
  });

  router.get('/sheets/:id/orders', async (req, res) => {
    const ctx = await requireShopRole(auth, db, req, { job: ['read'] });
    res.json({ orders: sheetOrders(db, ctx.shop.id, req.params.id) });
  });

  router.get('/incoming', async (req, res) => {
    const request = pageRequest(req);
    const ctx = await requireShopRole(auth, db, req, { incoming: ['read'] });
    if (ctx.shop.kind !== 'grinding') throw forbidden('Switch to your grinding shop to see incoming sheets');
    const page = toPage(incomingRows(db, ctx.shop.id, request), request.limit, (r) => ({ at: r.createdAt, id: r.order.id }));
    res.json({ orders: page.rows.map((r) => r.order), nextCursor: page.nextCursor });
  });

  router.get('/orders/:id', async (req, res) => {
    const ctx = await requireMember(auth, db, req);
    const { order } = requireOrder(db, ctx, req.params.id);
    res.json({ order: loadDetail(db, order) });
  });

  router.post('/orders/:id/move', async (req, res) => {
    const body = parse(orderMoveSchema, req.body);
    const ctx = await requireMember(auth, db, req);
    const { order } = moveOrder(db, ctx, req.params.id, body, (tx, moved) => {
      const { stage } = moved.order;
      if (stage === 'quoted' || stage === 'changes-asked' || stage === 'shipped') queueOrderMail(tx, stage, moved.order, { message: moved.message });
    });
    res.json({ order: loadDetail(db, order) });
  });

  router.get('/orders/:id/messages', async (req, res) => {
    const ctx = await requireMember(auth, db, req);
    const { order } = requireOrder(db, ctx, req.params.id);
    res.json({ messages: loadMessages(db, order) });
  });

  router.post('/orders/:id/messages', async (req, res) => {
    const body = parse(messageSchema, req.body);
    const ctx = await requireMember(auth, db, req);
    res.status(201).json({ message: addOrderMessage(db, ctx, req.params.id, body) });
  });

  return router;
}
