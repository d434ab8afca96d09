/** Sign-in, bearer tokens (random, stored as SHA-256, expiring) and integration tokens. */
import crypto from 'node:crypto';
import { config } from '../config';
import { forbidden, notFound, unauthorized, invalid } from '../errors';
import { ApiToken, User, type Role } from '../models';
import { audit } from './audit';
import { verifyPassword } from './passwords';

/** Who is calling: the user, their role, and the projects a token limits them to. */
export interface Principal {
  userId: number;
  email: string;
  name: string;
  role: Role;
  tokenId: number;
  /** null: every project (users); a list: an integration token's projects. */
  projectIds: number[] | null;
}

const hashToken = (token: string) => crypto.createHash('sha256').update(token).digest('hex');

async function issue(
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

export async function login(email: string, password: string) {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  const ok = user !== null && user.active && (await verifyPassword(password, user.passwordHash));
  if (!user || !ok) throw unauthorized('Wrong e-mail or password.');
  const { token, row } = await issue(user, 'session', config.sessionHours);
  await audit(user.id, 'login', 'user', user.id);
  return { token, tokenType: 'Bearer', expiresAt: row.expiresAt, user: publicUser(user) };
}

export async function logout(p: Principal): Promise<void> {
  await ApiToken.update({ revokedAt: new Date() }, { where: { id: p.tokenId } });
  await audit(p.userId, 'logout', 'user', p.userId);
}

/** The principal of a bearer token, or null when it is unknown, revoked or expired. */
export async function principalOf(token: string): Promise<Principal | null> {
  const row = await ApiToken.findOne({ where: { tokenHash: hashToken(token) }, include: [User] });
  const user = (row as (ApiToken & { User?: User }) | null)?.User;
  if (!row || !user || !user.active || row.revokedAt || row.expiresAt.getTime() <= Date.now()) {
    return null;
  }
  await row.update({ lastUsedAt: new Date() });
  return {
    userId: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    tokenId: row.id,
    projectIds: row.kind === 'integration' ? (row.projectIds ?? []) : null,
  };
}

export function publicUser(u: User) {
  return { id: u.id, email: u.email, name: u.name, role: u.role, active: u.active };
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
  const { token, row } = await issue(user, 'integration', days * 24, {
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

/** Throws 403 unless the principal may use the project (integration tokens are scoped). */
export function assertProject(p: Principal, projectId: number): void {
  if (p.projectIds !== null && !p.projectIds.includes(projectId)) {
    throw forbidden('This token is not granted this project.');
  }
}
