import { aliasedTable, and, desc, eq, inArray, min, ne } from 'drizzle-orm';

import { schema } from '@/db';
import { lifecycleStageLabels, lifecycleStages, type Lifecycle, type LifecycleFacts, type LifecycleStage, type LifecycleStageKey } from '@/shared/lifecycle';

import { notFound } from '../http';
import type { Reader } from './db';
import { latestRunOfRevision } from './fit-checks';
import { findJob } from './jobs';
import { orderEvents } from './orders';
import { loadApproval } from './owner-page';

const iso = (at: Date | number | null | undefined) => (at == null ? null : new Date(at).toISOString());

/** When the order was first moved to each of the stages the lifecycle names, from the order's events. */
function movedAt(db: Reader, orderId: string): NonNullable<LifecycleFacts['order']>['movedAt'] {
  const out: NonNullable<LifecycleFacts['order']>['movedAt'] = {};
  for (const e of orderEvents(db, orderId)) {
    const to = e.action === 'move' ? e.detail?.to : undefined;
    if ((to === 'shipped' || to === 'received' || to === 'installed') && !out[to]) out[to] = e.at;
  }
  return out;
}

/** What the job's records say about each stage; the firm order and the checks are the approved revision's only. */
export function lifecycleFacts(db: Reader, shopId: string, jobId: string): LifecycleFacts {
  const job = findJob(db, shopId, jobId);
  if (!job) throw notFound('Job');
  const m = schema.measurements;
  const measured = db
    .select({ at: min(m.createdAt) })
    .from(m)
    .where(and(eq(m.jobId, jobId), eq(m.shopId, shopId), ne(m.kind, 'degree')))
    .get();
  const degree = db
    .select({ at: m.createdAt })
    .from(m)
    .where(and(eq(m.jobId, jobId), eq(m.shopId, shopId), eq(m.kind, 'degree')))
    .orderBy(desc(m.createdAt))
    .get();
  const link = db
    .select({ at: min(schema.shareLinks.createdAt) })
    .from(schema.shareLinks)
    .where(and(eq(schema.shareLinks.jobId, jobId), eq(schema.shareLinks.shopId, shopId)))
    .get();
  const approval = loadApproval(db, jobId);
  const approvedNumber = approval
    ? db.select({ number: schema.sheetRevisions.number }).from(schema.sheetRevisions).where(eq(schema.sheetRevisions.id, approval.revisionId)).get()?.number
    : undefined;
  const grinders = aliasedTable(schema.shops, 'grinder_shops');
  const sheetIds = db.select({ id: schema.specSheets.id }).from(schema.specSheets).where(eq(schema.specSheets.jobId, jobId));
  const orders = db
    .select({
      order: {
        id: schema.grindOrders.id,
        revisionId: schema.grindOrders.revisionId,
        checksum: schema.grindOrders.checksum,
        createdAt: schema.grindOrders.createdAt,
        firmBy: schema.grindOrders.firmBy,
        firmAt: schema.grindOrders.firmAt,
        firmReason: schema.grindOrders.firmReason,
      },
      number: schema.sheetRevisions.number,
      grinderName: grinders.name,
    })
    .from(schema.grindOrders)
    .innerJoin(schema.sheetRevisions, eq(schema.sheetRevisions.id, schema.grindOrders.revisionId))
    .innerJoin(grinders, eq(grinders.id, schema.grindOrders.grinderShopId))
    .where(and(eq(schema.grindOrders.repairShopId, shopId), inArray(schema.grindOrders.sheetId, sheetIds)))
    .all();
  // The job's firm order: the approved revision's, else the newest revision a builder confirmed without the owner.
  const firm = approval
    ? orders.find((o) => o.order.revisionId === approval.revisionId && o.order.firmBy !== null)
    : orders.filter((o) => o.order.firmBy === 'builder').sort((a, b) => b.number - a.number)[0];
  const checkedRevision = approval?.revisionId ?? firm?.order.revisionId;
  const run = checkedRevision ? latestRunOfRevision(db, shopId, checkedRevision) : null;
  return {
    findings: job.findings.trim() !== '',
    firstMeasurementAt: iso(measured?.at),
    firstLinkAt: iso(link?.at),
    approval:
      approval && approvedNumber !== undefined
        ? {
            at: approval.createdAt.toISOString(),
            name: approval.approverName,
            optionTitle: approval.optionTitle,
            revisionNumber: approvedNumber,
            checksum: approval.checksum,
          }
        : null,
    order: firm
      ? {
          at: (firm.order.firmAt ?? firm.order.createdAt).toISOString(),
          confirmedReason: firm.order.firmBy === 'builder' ? (firm.order.firmReason ?? '') : null,
          grinderName: firm.grinderName,
          revisionNumber: firm.number,
          checksum: firm.order.checksum,
          movedAt: movedAt(db, firm.order.id),
        }
      : null,
    otherOrders: orders.length - (firm ? 1 : 0),
    degreedAt: iso(degree?.at),
    check: run ? { at: run.createdAt, by: run.createdByName, label: run.summary.label } : null,
    returned: job.status === 'delivered',
  };
}

/** The later of two ISO times, or null unless both are there. */
const later = (a: string | null | undefined, b: string | null | undefined) => (a && b ? (a > b ? a : b) : null);

/** Each stage from the facts (pure). A stage counts as done only when its own record is there, whatever came before it. */
export function jobLifecycle(f: LifecycleFacts): Lifecycle {
  const order = f.order;
  const installed = order?.movedAt.installed ?? null;
  const entries: Record<LifecycleStageKey, Omit<LifecycleStage, 'key' | 'label'>> = {
    findings: { done: f.findings, at: null, detail: f.findings ? null : 'Write what teardown found on the job' },
    measured: { done: f.firstMeasurementAt !== null, at: f.firstMeasurementAt, detail: null },
    offered: { done: f.firstLinkAt !== null, at: f.firstLinkAt, detail: f.firstLinkAt ? null : 'No summary link sent to the owner yet' },
    approved: {
      done: f.approval !== null || order?.confirmedReason != null,
      at: f.approval?.at ?? (order?.confirmedReason != null ? order.at : null),
      detail: f.approval
        ? `${f.approval.optionTitle}, revision ${f.approval.revisionNumber} · ${f.approval.checksum}, by ${f.approval.name}`
        : order?.confirmedReason != null
          ? `Skipped: the shop confirmed revision ${order.revisionNumber} without the owner (${order.confirmedReason})`
          : null,
    },
    ordered: {
      done: order !== null,
      at: order?.at ?? null,
      detail: order
        ? `Revision ${order.revisionNumber} · ${order.checksum} to ${order.grinderName}`
        : f.otherOrders > 0
          ? `${f.otherOrders} ${f.otherOrders === 1 ? 'order' : 'orders'} out for a quote, none firm yet`
          : null,
    },
    shipped: { done: Boolean(order?.movedAt.shipped), at: order?.movedAt.shipped ?? null, detail: null },
    received: { done: Boolean(order?.movedAt.received), at: order?.movedAt.received ?? null, detail: null },
    installed: {
      done: Boolean(installed && f.degreedAt),
      at: later(installed, f.degreedAt),
      detail:
        installed && !f.degreedAt ? 'Installed; the cam is not degreed yet' : !installed && f.degreedAt ? 'Degreed; the order is not marked installed' : null,
    },
    checked: {
      done: f.check !== null,
      at: f.check?.at ?? null,
      detail: f.check ? `${f.check.label}${f.check.by ? `, by ${f.check.by}` : ''}` : null,
    },
    returned: { done: f.returned, at: null, detail: null },
  };
  const stages = lifecycleStages.map((key) => ({ key, label: lifecycleStageLabels[key], ...entries[key] }));
  return { stages, next: stages.find((s) => !s.done)?.key ?? null };
}

/** The job's lifecycle, read from its records; a 404 for another shop's job. */
export const loadLifecycle = (db: Reader, shopId: string, jobId: string) => jobLifecycle(lifecycleFacts(db, shopId, jobId));
