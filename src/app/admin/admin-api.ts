import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type {
  AccountRole,
  AccountRow,
  AccountSortKey,
  AdminSettings,
  AuditRow,
  OutboxMessage,
  OutboxRow,
  Page,
} from '../../../shared/api/accounts';
import { requestFlags } from '../core/request-flags';

export interface AccountQuery {
  page: number;
  size: number;
  sort: AccountSortKey;
  dir: 'asc' | 'desc';
  filter: string;
}

/** The admin console's calls to /api/admin. */
@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  settings(): Observable<AdminSettings> {
    return this.http.get<AdminSettings>('/api/admin/settings');
  }

  accounts(q: AccountQuery): Observable<Page<AccountRow>> {
    return this.http.get<Page<AccountRow>>('/api/admin/accounts', { params: new HttpParams({ fromObject: { ...q } }) });
  }

  /** The dialog shows field errors itself. */
  invite(body: { email: string; name: string; role: AccountRole }): Observable<{ id: number }> {
    const context = requestFlags({ ownErrors: true });
    return this.http.post<{ id: number }>('/api/admin/invitations', body, { context });
  }

  resendInvitation(id: number): Observable<unknown> {
    return this.http.post(`/api/admin/accounts/${id}/invitation`, {});
  }

  revokeInvitation(id: number): Observable<unknown> {
    return this.http.delete(`/api/admin/accounts/${id}/invitation`);
  }

  setActive(id: number, active: boolean): Observable<unknown> {
    return this.http.post(`/api/admin/accounts/${id}/${active ? 'reactivate' : 'deactivate'}`, {});
  }

  changeRole(id: number, role: AccountRole): Observable<unknown> {
    return this.http.put(`/api/admin/accounts/${id}/role`, { role });
  }

  sendResetLink(id: number): Observable<unknown> {
    return this.http.post(`/api/admin/accounts/${id}/password-reset`, {});
  }

  audit(q: { page: number; size: number; filter: string }): Observable<Page<AuditRow>> {
    return this.http.get<Page<AuditRow>>('/api/admin/audit', { params: new HttpParams({ fromObject: { ...q } }) });
  }

  outbox(q: { page: number; size: number }): Observable<Page<OutboxRow>> {
    return this.http.get<Page<OutboxRow>>('/api/admin/outbox', { params: new HttpParams({ fromObject: { ...q } }) });
  }

  message(id: number): Observable<OutboxMessage> {
    return this.http.get<OutboxMessage>(`/api/admin/outbox/${id}`);
  }
}
