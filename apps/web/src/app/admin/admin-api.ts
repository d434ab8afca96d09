import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { Project, Role, User } from '../core/models';

/** A user as GET /users lists it (and PATCH /users/{id} answers). */
export interface AdminUser extends User {
  active: boolean;
}

/** What an admin may change about a user. */
export interface UserChanges {
  name?: string;
  role?: Role;
  active?: boolean;
}

export interface Invitation {
  name: string;
  email: string;
  role: Role;
}

/**
 * The answer to an invitation: the new user, and whether the one-time password went out by
 * mail (`invited: true`). A server without mail answers `invited: false` with the password for
 * the admin to hand over; an integration user has neither (it holds API tokens only).
 */
export interface Invited extends AdminUser {
  invited?: boolean;
  password?: string;
}

/** An integration token as GET /tokens lists it (the token itself is never listed). */
export interface ApiToken {
  id: number;
  userId: number;
  name: string | null;
  projectIds: number[] | null;
  /** When it was made. */
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
  lastUsedAt: string | null;
}

export interface NewToken {
  userId: number;
  name: string;
  projectIds: number[];
  /** How long it lives: a whole number of days from 1 to 3650 (the API refuses others, 422). */
  days: number;
}

/** The answer to POST /tokens: the token's row and, this once, the token. */
export interface CreatedToken extends ApiToken {
  token: string;
}

const BASE = '/api/v1';

/** The admin's side of the API: users, invitations and integration tokens. */
@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  users(): Observable<AdminUser[]> {
    return this.http.get<AdminUser[]>(`${BASE}/users`);
  }

  /** Creates the user without a password: the API mails them a one-time password. */
  invite(body: Invitation): Observable<Invited> {
    return this.http.post<Invited>(`${BASE}/users`, {
      name: body.name,
      email: body.email,
      role: body.role,
    });
  }

  updateUser(id: number, changes: UserChanges): Observable<AdminUser> {
    return this.http.patch<AdminUser>(`${BASE}/users/${id}`, changes);
  }

  projects(): Observable<Project[]> {
    return this.http.get<Project[]>(`${BASE}/projects`);
  }

  tokens(): Observable<ApiToken[]> {
    return this.http.get<ApiToken[]>(`${BASE}/tokens`);
  }

  createToken(body: NewToken): Observable<CreatedToken> {
    return this.http.post<CreatedToken>(`${BASE}/tokens`, body);
  }

  revokeToken(id: number): Observable<ApiToken> {
    return this.http.delete<ApiToken>(`${BASE}/tokens/${id}`);
  }
}
