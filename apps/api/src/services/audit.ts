/** The audit log: one row per change, who did it and to what; the latest for the admins. */
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

/** The latest entries of the audit log, newest first (at most `limit`). */
export async function listAudit(limit = 200) {
  const rows = await AuditEntry.findAll({ order: [['id', 'DESC']], limit });
  return rows.map((r) => r.toJSON());
}
