import type { Transaction } from 'sequelize';
import { AuditEntry } from '../db/models';

/** Record who changed what, inside the transaction of the change so both land or neither does. */
export async function recordAudit(
  transaction: Transaction,
  userId: number | null,
  action: string,
  entity: string,
  entityId: number | null,
  detail: Record<string, unknown> | null = null,
) {
  await AuditEntry.create({ userId, action, entity, entityId, detail, at: new Date() }, { transaction });
}
