import { HttpClient } from '@angular/common/http';
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
} from '../../../shared/api/accounts';
import type { Page, PageQuery } from '../../../shared/api/lists';
import { pageParams } from '../core/page-params';
import { requestFlags } from '../core/request-flags';

/** The admin console's calls to /api/admin. */
@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  settings(): Observable<AdminSettings> {
    return this.http.get<AdminSettings>('/api/admin/settings');
  }

  accounts(q: PageQuery<AccountSortKey>): Observable<Page<AccountRow>> {
    return this.http.get<Page<AccountRow>>('/api/admin/accounts', { params: pageParams(q) });
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

  audit(q: Omit<PageQuery, 'sort' | 'direction'>): Observable<Page<AuditRow>> {
    return this.http.get<Page<AuditRow>>('/api/admin/audit', { params: pageParams(q) });
  }

  outbox(q: Omit<PageQuery, 'sort' | 'direction' | 'q'>): Observable<Page<OutboxRow>> {
    return this.http.get<Page<OutboxRow>>('/api/admin/outbox', { params: pageParams(q) });
  }

  message(id: number): Observable<OutboxMessage> {
    return this.http.get<OutboxMessage>(`/api/admin/outbox/${id}`);
  }
}
