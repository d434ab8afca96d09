/** Signing in and out (session tokens), who a bearer token is, and what they may reach. */
import { config } from '../config';
import { forbidden, unauthorized } from '../errors';
import { ApiToken, User, type Role } from '../models';
import { audit } from './audit';
import { verifyPassword } from './passwords';
import { hashToken, issueToken } from './tokens';
import { publicUser } from './views';

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

export async function login(email: string, password: string) {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  const ok = user !== null && user.active && (await verifyPassword(password, user.passwordHash));
  if (!user || !ok) throw unauthorized('Wrong e-mail or password.');
  const { token, row } = await issueToken(user, 'session', config.sessionHours);
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
  const user = row?.User;
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

/** Throws 403 unless the principal may use the project (integration tokens are scoped). */
export function assertProject(p: Principal, projectId: number): void {
  if (p.projectIds !== null && !p.projectIds.includes(projectId)) {
    throw forbidden('This token is not granted this project.');
  }
}
