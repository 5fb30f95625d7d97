import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { JoinState, MyDebrief, Nomination, SurveyState } from '../../../shared/api/workshops';
import { HANDLES_ERRORS } from '../core/error-interceptor';

/** Calls a participant page makes with its link token; every page shows errors itself. */
@Injectable({ providedIn: 'root' })
export class ParticipantApi {
  private readonly http = inject(HttpClient);
  private readonly own = { context: new HttpContext().set(HANDLES_ERRORS, true) };

  state(token: string): Promise<SurveyState> {
    return firstValueFrom(this.http.get<SurveyState>(`/api/p/${encodeURIComponent(token)}`, this.own));
  }
  consent(token: string): Promise<SurveyState> {
    return firstValueFrom(this.http.post<SurveyState>(`/api/p/${encodeURIComponent(token)}/consent`, {}, this.own));
  }
  /** `nobody` is the explicit "I talk to nobody here regularly" answer (sent only when chosen). */
  save(token: string, version: number, nominations: Nomination[], nobody = false): Promise<SurveyState> {
    const body = nobody ? { version, nominations, nobody: true } : { version, nominations };
    return firstValueFrom(this.http.put<SurveyState>(`/api/p/${encodeURIComponent(token)}/answers`, body, this.own));
  }
  debrief(token: string): Promise<MyDebrief> {
    return firstValueFrom(this.http.get<MyDebrief>(`/api/p/${encodeURIComponent(token)}/debrief`, this.own));
  }
  join(code: string): Promise<JoinState> {
    return firstValueFrom(this.http.get<JoinState>(`/api/p/join/${encodeURIComponent(code)}`, this.own));
  }
  claim(code: string, participantId: number): Promise<{ path: string; name: string }> {
    return firstValueFrom(
      this.http.post<{ path: string; name: string }>(`/api/p/join/${encodeURIComponent(code)}/claim`, { participantId }, this.own),
    );
  }
}
