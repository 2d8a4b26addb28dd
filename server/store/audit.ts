import type { Db } from '@/db';
import { schema } from '@/db';

type AuditEntry = {
  shopId: string | null;
  userId: string | null;
  action: string;
  entity: string;
  entityId: string;
  detail?: Record<string, unknown>;
};

/** Records one write. Call it inside the same transaction as the write itself. */
export function audit(tx: Pick<Db, 'insert'>, entry: AuditEntry) {
  tx.insert(schema.auditLog).values(entry).run();
}
