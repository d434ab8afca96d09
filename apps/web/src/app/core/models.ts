/** The shapes the web app reads from the Scarpline API (/api/v1). */

export type Role = 'admin' | 'engineer' | 'reviewer' | 'viewer' | 'integration';

export const ROLES: readonly Role[] = ['admin', 'engineer', 'reviewer', 'viewer', 'integration'];

export interface User {
  id: number;
  email: string;
  name: string;
  role: Role;
  active?: boolean;
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

/** One located message of the API's 422 problems (file, line, column, path into the data). */
export interface LocatedError {
  severity: 'error' | 'warning';
  file: string;
  line?: number;
  column?: number;
  path: string;
  code: string;
  message: string;
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
