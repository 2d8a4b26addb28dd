import { Router } from 'express';

import { confirmOrderSchema, issueSchema, messageSchema, orderMoveSchema, orderStageLabels, underWayStages, type OrderStage } from '@/shared/orders';

import { actorOf, requireMember, requireShopRole } from '../access';
import type { AppDeps } from '../deps';
import { forbidden, parse } from '../http';
import { queueOrderMail } from '../mail/order-mail';
import { queueWithdrawnMail } from '../mail/owner-mail';
import { pageRequest, toPage } from '../paging';
import {
  addOrderMessage,
  confirmOrder,
  grindingShops,
  incomingRows,
  issueSheet,
  loadDetail,
  loadMessages,
  moveOrder,
  requireOrder,
  sheetOrders,
} from '../store/orders';

/** Stages in which the cam is still with the grinder: a superseded order there is mailed to the grinding shop. */
const grinderHoldsStages: readonly OrderStage[] = ['sent', 'quoted', 'grinding'];

/**
 * Grind orders: a builder issues a sheet's draft revision to a grinding shop; both
 * shops then move the order through the stages in shared/orders.ts, and talk in its thread.
 */
export function ordersRouter(deps: AppDeps) {
  const { db, auth } = deps;
  const router = Router();

  router.get('/grinding-shops', async (req, res) => {
    await requireShopRole(auth, db, req, { sheet: ['issue'] });
    res.json({ shops: grindingShops(db) });
  });

  router.post('/sheets/:id/issue', async (req, res) => {
    const body = parse(issueSchema, req.body);
    const ctx = await requireShopRole(auth, db, req, { sheet: ['issue'] });
    const order = issueSheet(db, actorOf(ctx), req.params.id, body, (tx, issued, superseded, withdrawn) => {
      queueOrderMail(tx, deps, 'issued', issued, { message: body.note || null });
      // The owner whose approval this issue withdrew is asked again.
      if (withdrawn) queueWithdrawnMail(tx, deps, withdrawn, issued.repairShop);
      // The grinder of each order this supersedes hears of it while the work is still in their hands.
      for (const old of superseded.filter((o) => grinderHoldsStages.includes(o.stage))) {
        const underWay = underWayStages.includes(old.stage);
        queueOrderMail(tx, deps, 'superseded', old, { superseded: { by: issued.revisionNumber, stageLabel: orderStageLabels[old.stage], underWay } });
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
      if (stage === 'quoted' || stage === 'changes-asked' || stage === 'shipped') queueOrderMail(tx, deps, stage, moved.order, { message: moved.message });
    });
    res.json({ order: loadDetail(db, order) });
  });

  router.post('/orders/:id/confirm', async (req, res) => {
    const body = parse(confirmOrderSchema, req.body);
    const ctx = await requireMember(auth, db, req);
    const order = confirmOrder(db, ctx, req.params.id, body, (tx, confirmed) => queueOrderMail(tx, deps, 'confirmed', confirmed));
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
