/** Users: admins create, invite, change and disable them. */
import crypto from 'node:crypto';
import { badCharacter } from '@scarpline/core/input';
import { UniqueConstraintError } from 'sequelize';
import { sequelize } from '../db';
import { conflict, invalid, notFound, Problem } from '../errors';
import { ApiToken, ROLES, User, type Role } from '../models';
import { audit } from './audit';
import type { Principal } from './auth';
import { invitation, mailConfigured } from './mail';
import { checkNewPassword, hashPassword } from './passwords';
import { API_LIMITS } from '../limits';
import { publicUser } from './views';

export async function listUsers() {
  return (await User.findAll({ order: [['id', 'ASC']] })).map(publicUser);
}

/** An address with one @, something on each side and no spaces (the mail server judges the rest). */
const EMAIL = /^[^\s@]+@[^\s@]+$/;

/** No look-alike characters (0/O, 1/l/I), so a password copied from a mail by eye still works. */
const PASSWORD_ALPHABET = 'ABCDEFGHJKLMNPQRSTUVWXYZabcdefghijkmnopqrstuvwxyz23456789';
export const GENERATED_PASSWORD_LENGTH = 16;

/** A random password for an invitation: 16 characters from 57, about 93 bits. */
export function generatePassword(length = GENERATED_PASSWORD_LENGTH): string {
  let out = '';
  for (let i = 0; i < length; i++)
    out += PASSWORD_ALPHABET[crypto.randomInt(PASSWORD_ALPHABET.length)];
  return out;
}

/**
 * Creates a user. With a password: that password (at least 8 characters). Integration users get
 * none (they hold API tokens only). Anyone else without a password is invited: a password is
 * generated and mailed to them with the address to sign in at, and the answer says
 * `invited: true` without the password. When no mail is configured at all (production without
 * SMTP_URL) the answer carries the password instead (`invited: false`), for the admin to hand
 * over; when mail is configured but the message cannot be sent, nothing is created (502).
 */
export async function createUser(
  admin: Principal | null,
  body: { email: string; name: string; role: Role; password?: string },
) {
  if (!ROLES.includes(body.role)) throw invalid(`role is one of ${ROLES.join(', ')}.`);
  if (body.role !== 'integration' && body.password !== undefined) checkNewPassword(body.password);
  const email = body.email.trim().toLowerCase();
  if (!EMAIL.test(email)) throw invalid(`${email} is not an e-mail address.`);
  if (await User.findOne({ where: { email } })) throw conflict(`${email} exists already.`);
  const invite = body.role !== 'integration' && body.password === undefined;
  const password = invite ? generatePassword() : body.role === 'integration' ? null : body.password;
  const mail = invite && mailConfigured();
  const passwordHash = password ? await hashPassword(password) : null;
  return sequelize.transaction(async (transaction) => {
    const user = await User.create(
      {
        email,
        name: body.name,
        role: body.role,
        passwordHash,
        // an invitation's password is replaced at the first sign-in
        mustChangePassword: invite,
      },
      { transaction },
    ).catch((e: unknown) => {
      // another request made the same address in the meantime
      if (e instanceof UniqueConstraintError) throw conflict(`${email} exists already.`);
      throw e;
    });
    await audit(
      admin?.userId ?? null,
      'create',
      'user',
      user.id,
      invite ? { email, role: body.role, invited: mail } : { email, role: body.role },
      transaction,
    );
    if (!invite) return publicUser(user);
    if (!mail) return { ...publicUser(user), invited: false, password: password as string };
    const by = admin ? { name: admin.name, email: admin.email } : null;
    if (!(await invitation(user, password as string, by))) {
      // Thrown inside the transaction: the user is rolled back with it.
      throw new Problem(
        502,
        'Mail not sent',
        `The invitation to ${email} could not be sent, so the user was not created. Try again later, or create the user with a password.`,
      );
    }
    return { ...publicUser(user), invited: true };
  });
}

/** What PATCH /users/{id} may change. */
export const USER_FIELDS = ['name', 'role', 'active'] as const;

export interface UserChanges {
  name?: string;
  role?: Role;
  active?: boolean;
}

/** The changes of a PATCH body, checked; 422 naming the field otherwise. */
export function userChanges(body: unknown): UserChanges {
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    throw invalid(
      `Send the changes as a JSON object with one or more of ${USER_FIELDS.join(', ')}.`,
    );
  }
  const b = body as Record<string, unknown>;
  const unknown = Object.keys(b).filter((k) => !(USER_FIELDS as readonly string[]).includes(k));
  if (unknown.length > 0) {
    throw invalid(
      `These cannot be changed here: ${unknown.join(', ')}. A user's ${USER_FIELDS.join(', ')} can.`,
    );
  }
  if (Object.keys(b).length === 0) {
    throw invalid(`Send one or more of ${USER_FIELDS.join(', ')}.`);
  }
  const out: UserChanges = {};
  if (b.name !== undefined) {
    if (
      typeof b.name !== 'string' ||
      b.name.trim() === '' ||
      b.name.trim().length > API_LIMITS.name ||
      badCharacter(b.name) !== null
    ) {
      throw invalid(
        `name is a string of 1 to ${API_LIMITS.name} characters, without U+0000 or half a character.`,
      );
    }
    out.name = b.name.trim();
  }
  if (b.role !== undefined) {
    if (typeof b.role !== 'string' || !(ROLES as readonly string[]).includes(b.role)) {
      throw invalid(`role is one of ${ROLES.join(', ')}.`);
    }
    out.role = b.role as Role;
  }
  if (b.active !== undefined) {
    if (typeof b.active !== 'boolean') throw invalid('active is true or false.');
    out.active = b.active;
  }
  return out;
}

/**
 * Changes a user's name, role or whether they may sign in. A disabled user's sign-in fails and
 * every token of theirs is refused from the next request on (principalOf checks `active`); their
 * sign-in sessions are also revoked, so enabling them again does not bring those back. Their
 * integration tokens are kept and work again once they are enabled (revoke them to end them).
 * Nobody disables or demotes themselves, so there is always an admin left.
 */
export async function updateUser(admin: Principal, id: number, body: unknown) {
  const changes = userChanges(body);
  const user = await User.findByPk(id);
  if (!user) throw notFound('user');
  if (user.id === admin.userId) {
    if (changes.active === false) {
      throw conflict('You cannot disable your own account; ask another admin to do it.');
    }
    if (changes.role !== undefined && changes.role !== 'admin') {
      throw conflict('You cannot take the admin role from yourself; ask another admin to do it.');
    }
  }
  if (
    changes.role !== undefined &&
    (changes.role === 'integration') !== (user.role === 'integration')
  ) {
    const now =
      user.role === 'integration'
        ? 'an integration user (API tokens only, no password)'
        : `a person (${user.role})`;
    throw conflict(
      `${user.email} is ${now}; a user cannot change between integration and the other roles. Create a new user instead.`,
    );
  }
  const diff: Record<string, { from: unknown; to: unknown }> = {};
  for (const key of USER_FIELDS) {
    const to = changes[key];
    if (to !== undefined && to !== user[key]) diff[key] = { from: user[key], to };
  }
  if (Object.keys(diff).length === 0) return publicUser(user);
  await sequelize.transaction(async (transaction) => {
    await user.update(changes, { transaction });
    let sessionsRevoked = 0;
    if (diff.active && changes.active === false) {
      [sessionsRevoked] = await ApiToken.update(
        { revokedAt: new Date() },
        { where: { userId: user.id, kind: 'session', revokedAt: null }, transaction },
      );
    }
    await audit(
      admin.userId,
      'update',
      'user',
      user.id,
      diff.active && changes.active === false
        ? { changes: diff, sessionsRevoked }
        : { changes: diff },
      transaction,
    );
  });
  return publicUser(user);
}
