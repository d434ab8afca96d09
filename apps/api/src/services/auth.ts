/**
 * Signing in and out (session tokens), changing one's own password, who a bearer token is,
 * and what they may reach.
 */
import { Op } from 'sequelize';
import { config } from '../config';
import { sequelize } from '../db';
import { forbidden, invalid, notFound, unauthorized } from '../errors';
import { ApiToken, User, type Role } from '../models';
import { audit } from './audit';
import {
  checkNewPassword,
  hashPassword,
  needsRehash,
  verifyNothing,
  verifyPassword,
} from './passwords';
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
  /** The user signed in with an invitation's password and must replace it first. */
  mustChangePassword?: boolean;
}

/** An address as accounts are stored: trimmed, lower case. */
export const normalEmail = (email: string): string => email.trim().toLowerCase();

/**
 * Signs in: a session token. An unknown address, a disabled account, one without a password
 * (integration) and a wrong password all answer the same 401 after the same work (one
 * scrypt verification each: verifyNothing where there is no hash to check), so that neither
 * the answer nor its time tells which addresses have accounts. A hash of an older cost is
 * replaced by one of the current cost, with the token and its audit entry, in one transaction.
 */
export async function login(email: string, password: string) {
  const user = await User.findOne({ where: { email: normalEmail(email) } });
  const hash = user?.active ? user.passwordHash : null;
  const ok = hash ? await verifyPassword(password, hash) : await verifyNothing(password);
  if (!user || !hash || !ok) throw unauthorized('Wrong e-mail or password.');
  const rehash = needsRehash(hash) ? await hashPassword(password) : null;
  const { token, row } = await sequelize.transaction(async (transaction) => {
    if (rehash) await user.update({ passwordHash: rehash }, { transaction });
    const issued = await issueToken(user, 'session', config.sessionHours, {}, transaction);
    await audit(user.id, 'login', 'user', user.id, rehash ? { rehashed: true } : null, transaction);
    return issued;
  });
  return { token, tokenType: 'Bearer', expiresAt: row.expiresAt, user: publicUser(user) };
}

export async function logout(p: Principal): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    await ApiToken.update({ revokedAt: new Date() }, { where: { id: p.tokenId }, transaction });
    await audit(p.userId, 'logout', 'user', p.userId, null, transaction);
  });
}

/**
 * A signed-in user changes their own password: the current one, then the new one (of an
 * allowed length, not the same). Their other sign-in sessions end; this one goes on. Clears
 * the demand to replace an invitation's password. 403 for a wrong current password.
 */
export async function changePassword(p: Principal, current: string, next: string) {
  const user = await User.findByPk(p.userId);
  if (!user || !user.passwordHash) throw notFound('user');
  if (!(await verifyPassword(current, user.passwordHash))) {
    throw forbidden('The current password is wrong.');
  }
  checkNewPassword(next, 'newPassword');
  if (next === current) throw invalid('Choose a new password that differs from the current one.');
  const hash = await hashPassword(next);
  await sequelize.transaction(async (transaction) => {
    await user.update({ passwordHash: hash, mustChangePassword: false }, { transaction });
    const [ended] = await ApiToken.update(
      { revokedAt: new Date() },
      {
        where: { userId: user.id, kind: 'session', revokedAt: null, id: { [Op.ne]: p.tokenId } },
        transaction,
      },
    );
    await audit(user.id, 'change-password', 'user', user.id, { sessionsEnded: ended }, transaction);
  });
  return publicUser(user);
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
    mustChangePassword: row.kind === 'session' && user.mustChangePassword,
  };
}

/**
 * Throws 404 unless the principal may use the project (integration tokens are scoped): the
 * same answer as for a project, batch or section that does not exist, so that a token cannot
 * find out which ids exist outside its projects. `what` names what was asked for.
 */
export function assertProject(p: Principal, projectId: number, what = 'project'): void {
  if (p.projectIds !== null && !p.projectIds.includes(projectId)) throw notFound(what);
}
