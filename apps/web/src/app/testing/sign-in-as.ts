/**
 * For specs only: signs in by storing the session that Auth reads when it is created. Call it
 * before the TestBed makes Auth (before the first inject or createComponent); clear
 * sessionStorage after the test.
 */
import { SESSION_KEY } from '../core/auth';
import type { Role, Session, User } from '../core/models';

const HOUR_MS = 3600_000;

/**
 * Signed in as `role`, for an hour from now unless `session.expiresAt` says otherwise; the
 * user is id 1, `<role>@x.example`, named "The <role>" unless `user` says otherwise.
 */
export function signInAs(
  role: Role,
  user: Partial<Omit<User, 'role'>> = {},
  session: Partial<Pick<Session, 'token' | 'expiresAt'>> = {},
): Session {
  const s: Session = {
    token: session.token ?? 't',
    expiresAt: session.expiresAt ?? new Date(Date.now() + HOUR_MS).toISOString(),
    user: { id: 1, email: `${role}@x.example`, name: `The ${role}`, ...user, role },
  };
  sessionStorage.setItem(SESSION_KEY, JSON.stringify(s));
  return s;
}
