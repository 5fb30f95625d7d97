import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { LinkInfo } from '../../../shared/api/accounts';
import { requestFlags } from '../core/request-flags';

/** Calls behind the account pages; each page shows its own errors next to the form. */
@Injectable({ providedIn: 'root' })
export class AccountApi {
  private readonly http = inject(HttpClient);
  private readonly own = { context: requestFlags({ ownErrors: true }) };

  checkInvitation(token: string): Observable<LinkInfo> {
    return this.http.post<LinkInfo>('/api/auth/invitation/check', { token }, this.own);
  }

  acceptInvitation(token: string, name: string, password: string): Observable<{ email: string }> {
    return this.http.post<{ email: string }>('/api/auth/invitation/accept', { token, name, password }, this.own);
  }

  requestReset(email: string): Observable<{ message: string }> {
    return this.http.post<{ message: string }>('/api/auth/password-reset', { email }, this.own);
  }

  checkReset(token: string): Observable<LinkInfo> {
    return this.http.post<LinkInfo>('/api/auth/password-reset/check', { token }, this.own);
  }

  completeReset(token: string, password: string): Observable<{ email: string }> {
    return this.http.post<{ email: string }>('/api/auth/password-reset/complete', { token, password }, this.own);
  }

  changePassword(currentPassword: string, newPassword: string): Observable<unknown> {
    return this.http.post('/api/auth/password', { currentPassword, newPassword }, this.own);
  }
}
