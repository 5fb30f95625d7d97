import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom, type Observable } from 'rxjs';
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
import { HANDLES_ERRORS } from '../core/error-interceptor';
import { pageParams } from '../core/page-params';

/** The admin console's calls to /api/admin. */
@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  settings(): Promise<AdminSettings> {
    return firstValueFrom(this.http.get<AdminSettings>('/api/admin/settings'));
  }

  accounts(q: PageQuery<AccountSortKey>): Observable<Page<AccountRow>> {
    return this.http.get<Page<AccountRow>>('/api/admin/accounts', { params: pageParams(q) });
  }

  /** The dialog shows field errors itself. */
  invite(body: { email: string; name: string; role: AccountRole }): Promise<{ id: number }> {
    const context = new HttpContext().set(HANDLES_ERRORS, true);
    return firstValueFrom(this.http.post<{ id: number }>('/api/admin/invitations', body, { context }));
  }

  resendInvitation(id: number): Promise<unknown> {
    return firstValueFrom(this.http.post(`/api/admin/accounts/${id}/invitation`, {}));
  }

  revokeInvitation(id: number): Promise<unknown> {
    return firstValueFrom(this.http.delete(`/api/admin/accounts/${id}/invitation`));
  }

  setActive(id: number, active: boolean): Promise<unknown> {
    return firstValueFrom(this.http.post(`/api/admin/accounts/${id}/${active ? 'reactivate' : 'deactivate'}`, {}));
  }

  changeRole(id: number, role: AccountRole): Promise<unknown> {
    return firstValueFrom(this.http.put(`/api/admin/accounts/${id}/role`, { role }));
  }

  sendResetLink(id: number): Promise<unknown> {
    return firstValueFrom(this.http.post(`/api/admin/accounts/${id}/password-reset`, {}));
  }

  audit(q: Omit<PageQuery, 'sort' | 'direction'>): Observable<Page<AuditRow>> {
    return this.http.get<Page<AuditRow>>('/api/admin/audit', { params: pageParams(q) });
  }

  outbox(q: Omit<PageQuery, 'sort' | 'direction' | 'q'>): Observable<Page<OutboxRow>> {
    return this.http.get<Page<OutboxRow>>('/api/admin/outbox', { params: pageParams(q) });
  }

  message(id: number): Promise<OutboxMessage> {
    return firstValueFrom(this.http.get<OutboxMessage>(`/api/admin/outbox/${id}`));
  }
}
