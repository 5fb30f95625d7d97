import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { RehearsalSummary } from '../../../shared/api/plans';
import type { Page } from '../../../shared/api/lists';
import type { RoomListItem } from '../../../shared/api/rooms';
import type {
  BuildMode,
  BuildResult,
  IssuedLink,
  MissingAnswer,
  NewWorkshop,
  SurveyProgress,
  WorkshopDetail,
  WorkshopStatus,
  WorkshopSummary,
} from '../../../shared/api/workshops';
import { requestFlags } from '../core/request-flags';

/** The facilitator's workshop calls. */
@Injectable({ providedIn: 'root' })
export class WorkshopsApi {
  private readonly http = inject(HttpClient);
  private readonly base = '/api/workshops';
  private get<T>(url: string, quiet = false) {
    return this.http.get<T>(url, { context: requestFlags({ quiet }) });
  }
  private post<T>(url: string, body: unknown = {}, ownErrors = false) {
    return this.http.post<T>(url, body, { context: requestFlags({ ownErrors }) });
  }

  list = () => this.get<WorkshopSummary[]>(this.base);
  rooms = () => this.get<Page<RoomListItem>>('/api/rooms?pageSize=200&sort=name&direction=asc');
  create = (w: NewWorkshop) => this.post<WorkshopDetail>(this.base, w, true);
  detail = (id: number) => this.get<WorkshopDetail>(`${this.base}/${id}`);
  patch = (id: number, body: Partial<Pick<WorkshopDetail, 'title' | 'sessionDate' | 'nominationLimit' | 'linkDays' | 'showStarters'>>) =>
    this.http.patch<WorkshopDetail>(`${this.base}/${id}`, body);
  remove = (id: number) => this.http.delete<void>(`${this.base}/${id}`);
  move = (id: number, to: WorkshopStatus) => this.post<WorkshopDetail>(`${this.base}/${id}/status`, { to });
  addFacilitator = (id: number, email: string) => this.post<WorkshopDetail>(`${this.base}/${id}/facilitators`, { email });
  removeFacilitator = (id: number, userId: number) => this.http.delete<void>(`${this.base}/${id}/facilitators/${userId}`);
  addPeople = (id: number, people: { name: string; email: string | null }[]) =>
    this.post<{ added: number; skipped: string[]; workshop: WorkshopDetail }>(`${this.base}/${id}/participants`, { people });
  roster = (id: number, csv: string) =>
    this.post<{ added: number; skipped: string[]; issues: { line: number; message: string }[] }>(`${this.base}/${id}/participants/roster`, {
      csv,
    });
  fromRoom = (id: number) => this.post<{ added: number; skipped: string[] }>(`${this.base}/${id}/participants/from-room`);
  removeParticipant = (id: number, pid: number) => this.http.delete<void>(`${this.base}/${id}/participants/${pid}`);
  resetClaim = (id: number, pid: number) => this.post<void>(`${this.base}/${id}/participants/${pid}/reset-claim`);
  email = (id: number, participantIds?: number[]) =>
    this.post<{ sent: string[]; withoutEmail: string[]; failed: string[] }>(`${this.base}/${id}/links/email`, { participantIds });
  /** Each person's own link (the same one every time, until it is reissued). */
  sheet = (id: number, participantIds?: number[]) => this.post<IssuedLink[]>(`${this.base}/${id}/links/sheet`, { participantIds });
  /** Ends the chosen people's links and gives each a new one: only after the facilitator confirmed. */
  reissue = (id: number, participantIds: number[]) =>
    this.post<IssuedLink[]>(`${this.base}/${id}/links/reissue`, { participantIds, confirm: true });
  revoke = (id: number, participantIds: number[]) => this.post<{ revoked: number }>(`${this.base}/${id}/links/revoke`, { participantIds });
  joinCode = (id: number) => this.post<{ url: string; qr: string; expiresAt: string }>(`${this.base}/${id}/join-code`);
  progress = (id: number) => this.get<SurveyProgress>(`${this.base}/${id}/progress`, true);
  missing = (id: number, mode: BuildMode) => this.get<MissingAnswer[]>(`${this.base}/${id}/missing?mode=${mode}`);
  build = (id: number, mode: BuildMode) => this.post<BuildResult>(`${this.base}/${id}/build`, { mode });
  rehearsals = (roomId: number) => this.get<RehearsalSummary[]>(`/api/rooms/${roomId}/rehearsals`);
  release = (id: number, body: { rehearsalId: number; sampleRun: number; showStarters: boolean }) =>
    this.post<WorkshopDetail>(`${this.base}/${id}/release`, body);
}
