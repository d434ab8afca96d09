/** The audit log: one row per change, who did it and to what. */
import type { Transaction } from 'sequelize';
import { AuditEntry } from '../models';

export async function audit(
  userId: number | null,
  action: string,
  entity: string,
  entityId: number | null,
  details: object | null = null,
  transaction?: Transaction,
): Promise<void> {
  await AuditEntry.create({ userId, action, entity, entityId, details }, { transaction });
}
