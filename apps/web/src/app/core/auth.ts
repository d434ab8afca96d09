import { HttpClient } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { Router } from '@angular/router';
import { map, Observable, tap } from 'rxjs';
import type { LoginResponse, Role, Session, User } from './models';

/** Where the session is kept in sessionStorage. */
export const SESSION_KEY = 'scarpline.session';

function readSession(): Session | null {
  try {
    const raw = sessionStorage.getItem(SESSION_KEY);
    if (!raw) return null;
    const s = JSON.parse(raw) as Session;
    return new Date(s.expiresAt).getTime() > Date.now() ? s : null;
  } catch {
    return null;
  }
}

/**
 * The signed-in user and their bearer token, kept for the browser session (sessionStorage:
 * gone when the tab closes). A 401 anywhere calls expire(), which returns to sign-in.
 */
@Injectable({ providedIn: 'root' })
export class Auth {
  private readonly http = inject(HttpClient);
  private readonly router = inject(Router);
  private readonly session = signal<Session | null>(readSession());

  readonly user = computed<User | null>(() => this.session()?.user ?? null);
  readonly token = computed<string | null>(() => this.session()?.token ?? null);
  readonly signedIn = computed(() => this.session() !== null);

  signIn(email: string, password: string): Observable<User> {
    return this.http.post<LoginResponse>('/api/v1/auth/login', { email, password }).pipe(
      tap((r) => this.keep({ token: r.token, expiresAt: r.expiresAt, user: r.user })),
      map((r) => r.user),
    );
  }

  /** Revokes the token on the server (best effort) and forgets it here. */
  signOut(): void {
    const token = this.token();
    this.forget();
    if (token) {
      this.http
        .post('/api/v1/auth/logout', null, { headers: { Authorization: `Bearer ${token}` } })
        .subscribe({ error: () => undefined });
    }
    void this.router.navigateByUrl('/sign-in');
  }

  /** The token was refused: forget it and ask to sign in again, coming back here after. */
  expire(returnUrl: string): void {
    this.forget();
    const next = returnUrl.startsWith('/sign-in') ? undefined : returnUrl;
    void this.router.navigate(['/sign-in'], {
      queryParams: { next, expired: 1 },
    });
  }

  /** The signed-in user as the API now gives them (after a change of password). */
  updateUser(user: User): void {
    const s = this.session();
    if (s) this.keep({ ...s, user });
  }

  /** Whether the user must replace an invitation's password before anything else. */
  mustChangePassword(): boolean {
    return this.user()?.mustChangePassword === true;
  }

  hasRole(...roles: Role[]): boolean {
    const u = this.user();
    return u !== null && roles.includes(u.role);
  }

  private keep(s: Session): void {
    sessionStorage.setItem(SESSION_KEY, JSON.stringify(s));
    this.session.set(s);
  }

  private forget(): void {
    sessionStorage.removeItem(SESSION_KEY);
    this.session.set(null);
  }
}
