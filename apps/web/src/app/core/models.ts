/** The shapes the web app reads from the Scarpline API (/api/v1). */
import type { Message } from '@scarpline/core/input';

export type Role = 'admin' | 'engineer' | 'reviewer' | 'viewer' | 'integration';

export interface User {
  id: number;
  email: string;
  name: string;
  role: Role;
  active?: boolean;
  /** Signed in with an invitation's password: they choose their own before anything else. */
  mustChangePassword?: boolean;
}

export interface LoginResponse {
  token: string;
  tokenType: 'Bearer';
  expiresAt: string;
  user: User;
}

export interface Session {
  token: string;
  expiresAt: string;
  user: User;
}

/** A user as every role may see them beside what they did: id and name, never the e-mail. */
export interface UserRef {
  id: number;
  name: string;
}

/**
 * One located message of the API's 422 problems: the core's input message with `text` (it as
 * one line). Where the schema refused what the core could not place, the API leaves out the
 * line and column; the errors of a re-run's edits (not editable) have no file either.
 */
export interface LocatedError
  extends
    Omit<Message, 'file' | 'line' | 'column'>,
    Partial<Pick<Message, 'file' | 'line' | 'column'>> {
  text?: string;
}

/** An RFC 9457 problem as the API sends it. */
export interface Problem {
  type?: string;
  title: string;
  status: number;
  detail?: string;
  errors?: LocatedError[];
}

export interface Project {
  id: number;
  name: string;
  description: string | null;
  createdAt: string;
}
