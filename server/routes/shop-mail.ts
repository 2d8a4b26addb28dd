import { Router } from 'express';

import { requireTeamManager } from '../access';
import type { AppDeps } from '../deps';
import { notFound } from '../http';
import { audit } from '../store/audit';
import { failedMail, retryFailedMail } from '../store/outbox';

/**
 * The shop's mail that could not be sent after every try (only with SMTP_URL set: without it mail is only
 * kept), for its builder or grinder to see and send again.
 */
export function shopMailRouter({ db, auth, mailer }: AppDeps) {
  const router = Router();

  router.get('/shop/mail-failures', async (req, res) => {
    const ctx = await requireTeamManager(auth, db, req);
    res.json({ failures: failedMail(db, ctx.shop.id) });
  });

  router.post('/shop/mail-failures/:id/retry', async (req, res) => {
    const ctx = await requireTeamManager(auth, db, req);
    db.transaction((tx) => {
      if (!retryFailedMail(tx, ctx.shop.id, req.params.id)) throw notFound('Failed mail');
      audit(tx, { shopId: ctx.shop.id, userId: ctx.user.id, action: 'retry', entity: 'mail', entityId: req.params.id });
    });
    mailer.onQueued?.();
    res.json({ failures: failedMail(db, ctx.shop.id) });
  });

  return router;
}
