/**
 * API tokens: random bearer tokens stored as their SHA-256, each expiring. Sign-in issues a
 * session token (auth.ts); an admin creates, lists and revokes integration tokens here.
 */
import crypto from 'node:crypto';
import { invalid, notFound } from '../errors';
import { ApiToken, User } from '../models';
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
): Promise<{ token: string; row: ApiToken }> {
  const token = `${kind === 'session' ? 'sls' : 'sli'}_${crypto.randomBytes(32).toString('base64url')}`;
  const row = await ApiToken.create({
    userId: user.id,
    kind,
    name: extra.name ?? null,
    tokenHash: hashToken(token),
    projectIds: extra.projectIds ?? null,
    expiresAt: new Date(Date.now() + hours * 3600 * 1000),
    revokedAt: null,
    lastUsedAt: null,
  });
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
  const { token, row } = await issueToken(user, 'integration', days * 24, {
    name: body.name,
    projectIds: body.projectIds,
  });
  await audit(admin.userId, 'create', 'api_token', row.id, { userId: user.id, name: body.name });
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
  if (!row.revokedAt) await row.update({ revokedAt: new Date() });
  await audit(admin.userId, 'revoke', 'api_token', row.id);
  return tokenView(row);
}
