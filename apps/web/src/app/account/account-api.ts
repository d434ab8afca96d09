import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { User } from '../core/models';
import type { PasswordChange, ResetAsked, ResetDone } from './account-types';

const BASE = '/api/v1';

/** The API's account routes: changing one's own password, and setting a new one by mail. */
@Injectable({ providedIn: 'root' })
export class AccountApi {
  private readonly http = inject(HttpClient);

  /** Changes the signed-in user's password; the answer is the user as they now are. */
  changePassword(body: PasswordChange): Observable<User> {
    return this.http.post<User>(`${BASE}/me/password`, body);
  }

  /** Asks for a link to set a new password, mailed to the address if it has an account. */
  askForReset(email: string): Observable<ResetAsked> {
    return this.http.post<ResetAsked>(`${BASE}/password-resets`, { email });
  }

  /** Sets a new password with the token of a mailed link. */
  reset(token: string, password: string): Observable<ResetDone> {
    return this.http.post<ResetDone>(`${BASE}/password-resets/confirm`, { token, password });
  }
}
