import { HttpClient, type HttpEvent } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type {
  CreateRoomRequest,
  ImportReport,
  RoomDto,
  RoomEditBatch,
  RoomEditResult,
  RoomListItem,
  RoomListQuery,
  RoomSummary,
  ShareDto,
  ShareRequest,
  ShareRole,
  UpdateRoomRequest,
} from '../../../shared/api/rooms';
import type { OrgChartReport } from '../../../shared/api/org-chart';
import type { Page } from '../../../shared/api/lists';
import { pageParams } from '../core/page-params';
import { requestFlags } from '../core/request-flags';

/** The rooms endpoints: the pages' calls and the editor's loading and saving (RoomEditor decides when). */
@Injectable({ providedIn: 'root' })
export class RoomsApi {
  private readonly http = inject(HttpClient);
  private readonly selfHandled = requestFlags({ ownErrors: true });

  list(q: RoomListQuery): Observable<Page<RoomListItem>> {
    return this.http.get<Page<RoomListItem>>('/api/rooms', { params: pageParams(q) });
  }

  /** The whole room for the editor, which shows a failure itself. */
  room(id: number): Observable<RoomDto> {
    return this.http.get<RoomDto>(`/api/rooms/${id}`, { context: this.selfHandled });
  }

  /** Name, description or settings, against the version the editor holds. */
  update(id: number, body: UpdateRoomRequest): Observable<RoomDto> {
    return this.http.patch<RoomDto>(`/api/rooms/${id}`, body, { context: this.selfHandled });
  }

  /** One batch of the editor's ops (with a version, unless it only moves people). */
  edit(id: number, body: RoomEditBatch): Observable<RoomEditResult> {
    return this.http.post<RoomEditResult>(`/api/rooms/${id}/edits`, body, { context: this.selfHandled });
  }

  create(body: CreateRoomRequest): Observable<RoomDto> {
    return this.http.post<RoomDto>('/api/rooms', body, { context: this.selfHandled });
  }

  duplicate(id: number, name: string): Observable<RoomDto> {
    return this.http.post<RoomDto>(`/api/rooms/${id}/duplicate`, { name });
  }

  delete(id: number): Observable<void> {
    return this.http.delete<void>(`/api/rooms/${id}`);
  }

  summary(id: number): Observable<RoomSummary> {
    return this.http.get<RoomSummary>(`/api/rooms/${id}/summary`, { context: requestFlags({ ownErrors: true, quiet: true }) });
  }

  /** Dry run or commit of an import; `roomId` null creates a new room. Reports upload progress. */
  import(roomId: number | null, form: FormData, dryRun: boolean): Observable<HttpEvent<ImportReport>> {
    const url = roomId === null ? '/api/rooms/import' : `/api/rooms/${roomId}/import`;
    return this.http.post<ImportReport>(url, form, {
      params: { dryRun: String(dryRun) },
      reportProgress: true,
      observe: 'events',
      context: this.selfHandled,
    });
  }

  /** Dry run or commit of an org-chart import (shared/api/org-chart.ts). */
  importOrgChart(roomId: number | null, form: FormData, dryRun: boolean): Observable<HttpEvent<OrgChartReport>> {
    const url = roomId === null ? '/api/rooms/import/org-chart' : `/api/rooms/${roomId}/import/org-chart`;
    return this.http.post<OrgChartReport>(url, form, {
      params: { dryRun: String(dryRun) },
      reportProgress: true,
      observe: 'events',
      context: this.selfHandled,
    });
  }

  shares(id: number): Observable<ShareDto[]> {
    return this.http.get<ShareDto[]>(`/api/rooms/${id}/shares`);
  }

  share(id: number, body: ShareRequest): Observable<ShareDto> {
    return this.http.post<ShareDto>(`/api/rooms/${id}/shares`, body, { context: this.selfHandled });
  }

  changeShare(id: number, userId: number, role: ShareRole): Observable<ShareDto> {
    return this.http.patch<ShareDto>(`/api/rooms/${id}/shares/${userId}`, { role });
  }

  revokeShare(id: number, userId: number): Observable<void> {
    return this.http.delete<void>(`/api/rooms/${id}/shares/${userId}`);
  }
}
