/**
 * API tokens: random bearer tokens stored as their SHA-256, each expiring. Sign-in issues a
 * session token (auth.ts); an admin creates, lists and revokes integration tokens here.
 */
import crypto from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { sequelize } from '../db';
import { invalid, notFound } from '../errors';
import { ApiToken, Project, User } from '../models';
import { audit } from './audit';
import type { Principal } from './auth';

/** The stored form of a token: its SHA-256, hex. */
export const hashToken = (token: string): string =>
  crypto.createHash('sha256').update(token).digest('hex');

/** A new token for the user, valid `hours` from now: the token (shown once) and its row. */
export async function issueToken(
  user: User,
  kind: 'session' | 'integration',
  hours: number,
  extra: { name?: string | null; projectIds?: number[] | null } = {},
  transaction?: Transaction,
): Promise<{ token: string; row: ApiToken }> {
  const token = `${kind === 'session' ? 'sls' : 'sli'}_${crypto.randomBytes(32).toString('base64url')}`;
  const row = await ApiToken.create(
    {
      userId: user.id,
      kind,
      name: extra.name ?? null,
      tokenHash: hashToken(token),
      projectIds: extra.projectIds ?? null,
      expiresAt: new Date(Date.now() + hours * 3600 * 1000),
      revokedAt: null,
      lastUsedAt: null,
    },
    { transaction },
  );
  return { token, row };
}

export async function createIntegrationToken(
  admin: Principal,
  body: { userId: number; name: string; projectIds: number[]; days?: number },
) {
  const user = await User.findByPk(body.userId);
  if (!user) throw notFound('user');
  if (user.role !== 'integration') throw invalid('API tokens are for users of role integration.');
  const days = body.days ?? 365;
  if (!Number.isInteger(days) || days < 1 || days > 3650) {
    throw invalid('days is a whole number of days from 1 to 3650.');
  }
  if (body.projectIds.length > 0) {
    const found = await Project.count({ where: { id: { [Op.in]: body.projectIds } } });
    if (found !== body.projectIds.length)
      throw invalid('projectIds names a project that does not exist.');
  }
  // The token and its audit entry together: a token whose secret was never shown cannot exist.
  const { token, row } = await sequelize.transaction(async (transaction) => {
    const issued = await issueToken(
      user,
      'integration',
      days * 24,
      { name: body.name, projectIds: body.projectIds },
      transaction,
    );
    await audit(
      admin.userId,
      'create',
      'api_token',
      issued.row.id,
      { userId: user.id, name: body.name },
      transaction,
    );
    return issued;
  });
  return { token, ...tokenView(row) };
}

export function tokenView(t: ApiToken) {
  return {
    id: t.id,
    userId: t.userId,
    name: t.name,
    projectIds: t.projectIds,
    expiresAt: t.expiresAt,
    revokedAt: t.revokedAt,
    lastUsedAt: t.lastUsedAt,
    createdAt: t.createdAt,
  };
}

export async function listIntegrationTokens() {
  const rows = await ApiToken.findAll({ where: { kind: 'integration' }, order: [['id', 'ASC']] });
  return rows.map(tokenView);
}

export async function revokeToken(admin: Principal, id: number) {
  const row = await ApiToken.findOne({ where: { id, kind: 'integration' } });
  if (!row) throw notFound('API token');
  await sequelize.transaction(async (transaction) => {
    if (!row.revokedAt) await row.update({ revokedAt: new Date() }, { transaction });
    await audit(admin.userId, 'revoke', 'api_token', row.id, null, transaction);
  });
  return tokenView(row);
}
