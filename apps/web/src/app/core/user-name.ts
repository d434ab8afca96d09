import type { UserRef } from './models';

/** A user by name, "(you)" after it for the signed-in user: "Evan Engineer (you)". */
export function userName(user: UserRef, me: number | null | undefined): string {
  return user.id === me ? `${user.name} (you)` : user.name;
}
