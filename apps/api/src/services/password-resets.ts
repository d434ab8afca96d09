/**
 * Password resets by mail: a person who forgot their password asks for a link (by e-mail
 * address), and sets a new password with the token in it. Tokens are random, stored as their
 * SHA-256, used once, and expire (RESET_MINUTES); a newer link replaces the older ones. Whether
 * an address has an account is never told: the request is answered the same either way.
 */
import crypto from 'node:crypto';
import { Op } from 'sequelize';
import { config } from '../config';
import { sequelize } from '../db';
import { badRequest } from '../errors';
import { ApiToken, PasswordReset, User } from '../models';
import { audit } from './audit';
import { normalEmail } from './auth';
import { passwordResetLink } from './mail';
import { checkNewPassword, hashPassword } from './passwords';
import { hashToken } from './tokens';

/** The address of the web app's page that sets a new password, with the token after `#`. */
export function resetLink(token: string): string {
  // After '#': a browser never sends it to a server, so it stays out of every access log.
  return new URL(`reset-password#token=${token}`, config.publicUrl).toString();
}

/**
 * Mails a link to set a new password to the account of `email`, if there is one that signs in
 * with a password (a person, active). Resolves when done; nothing is said to the caller
 * about whether a link went out.
 */
export async function requestReset(email: string): Promise<void> {
  const user = await User.findOne({ where: { email: normalEmail(email) } });
  if (!user || !user.active || !user.passwordHash || user.role === 'integration') return;
  const token = `slr_${crypto.randomBytes(32).toString('base64url')}`;
  const now = new Date();
  await sequelize.transaction(async (transaction) => {
    // a newer link replaces every older one still unused
    await PasswordReset.update(
      { usedAt: now },
      { where: { userId: user.id, usedAt: null }, transaction },
    );
    const row = await PasswordReset.create(
      {
        userId: user.id,
        tokenHash: hashToken(token),
        expiresAt: new Date(now.getTime() + config.resetMinutes * 60_000),
        usedAt: null,
      },
      { transaction },
    );
    await audit(
      user.id,
      'request-password-reset',
      'user',
      user.id,
      { resetId: row.id },
      transaction,
    );
  });
  await passwordResetLink(user, resetLink(token), config.resetMinutes);
}

const NOT_VALID =
  'This link to set a new password is not valid: it was used already, has expired, or a newer one was sent. Ask for a new link.';

/**
 * Sets a new password with a reset token: once, before it expires. Every sign-in session of
 * the user ends, and an invitation's password need not be replaced any more.
 */
export async function confirmReset(token: string, password: string): Promise<{ email: string }> {
  checkNewPassword(password);
  const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(token) } });
  if (!reset || reset.usedAt || reset.expiresAt.getTime() <= Date.now())
    throw badRequest(NOT_VALID);
  const user = await User.findByPk(reset.userId);
  if (!user || !user.active) throw badRequest(NOT_VALID);
  const hash = await hashPassword(password);
  await sequelize.transaction(async (transaction) => {
    // used once: of two requests with the same token only one marks it
    const [marked] = await PasswordReset.update(
      { usedAt: new Date() },
      { where: { id: reset.id, usedAt: null }, transaction },
    );
    if (marked !== 1) throw badRequest(NOT_VALID);
    await user.update({ passwordHash: hash, mustChangePassword: false }, { transaction });
    const [ended] = await ApiToken.update(
      { revokedAt: new Date() },
      { where: { userId: user.id, kind: 'session', revokedAt: { [Op.is]: null } }, transaction },
    );
    await audit(
      user.id,
      'reset-password',
      'user',
      user.id,
      { resetId: reset.id, sessionsEnded: ended },
      transaction,
    );
  });
  return { email: user.email };
}
