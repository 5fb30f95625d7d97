import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { LinkInfo } from '../../../shared/api/accounts';
import { HANDLES_ERRORS } from '../core/error-interceptor';

/** Calls behind the account pages; each page shows its own errors next to the form. */
@Injectable({ providedIn: 'root' })
export class AccountApi {
  private readonly http = inject(HttpClient);
  private readonly quiet = { context: new HttpContext().set(HANDLES_ERRORS, true) };

  checkInvitation(token: string): Promise<LinkInfo> {
    return firstValueFrom(this.http.post<LinkInfo>('/api/auth/invitation/check', { token }, this.quiet));
  }

  acceptInvitation(token: string, name: string, password: string): Promise<{ email: string }> {
    return firstValueFrom(this.http.post<{ email: string }>('/api/auth/invitation/accept', { token, name, password }, this.quiet));
  }

  requestReset(email: string): Promise<{ message: string }> {
    return firstValueFrom(this.http.post<{ message: string }>('/api/auth/password-reset', { email }, this.quiet));
  }

  checkReset(token: string): Promise<LinkInfo> {
    return firstValueFrom(this.http.post<LinkInfo>('/api/auth/password-reset/check', { token }, this.quiet));
  }

  completeReset(token: string, password: string): Promise<{ email: string }> {
    return firstValueFrom(this.http.post<{ email: string }>('/api/auth/password-reset/complete', { token, password }, this.quiet));
  }

  changePassword(currentPassword: string, newPassword: string): Promise<unknown> {
    return firstValueFrom(this.http.post('/api/auth/password', { currentPassword, newPassword }, this.quiet));
  }
}
