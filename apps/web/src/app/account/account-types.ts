/** The shapes of the API's account routes: one's own password, and a reset by mail. */

/** The most and the fewest characters of a password (the API's limits, schemas/openapi.json). */
export const PASSWORD_MIN = 8;
export const PASSWORD_MAX = 256;

export interface PasswordChange {
  currentPassword: string;
  newPassword: string;
}

/** The answer to asking for a reset link: the same whether or not the address has an account. */
export interface ResetAsked {
  detail: string;
  expiresInMinutes: number;
}

/** The answer to setting a password with a reset link: the account's address, to sign in. */
export interface ResetDone {
  email: string;
}
