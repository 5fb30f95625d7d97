import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type {
  BriefingSheet,
  CreatePlanRequest,
  JobDto,
  KSweepResult,
  PlanComparison,
  PlanDetail,
  PlanStarted,
  PlanSummary,
  RehearsalDetail,
  RehearsalStarted,
  RehearsalSummary,
  ServerLimits,
  StartRehearsalRequest,
} from '../../../shared/api/plans';
import type { RoomDto } from '../../../shared/api/rooms';
import { requestFlags } from '../core/request-flags';

/** Requests whose errors the calling form shows itself. */
const OWN_ERRORS = { context: requestFlags({ ownErrors: true }) };
/** Polling-like calls that should not flash the shell's busy bar. */
const QUIET = { context: requestFlags({ quiet: true }) };

/** The plans and rehearsals API (shared/api/plans.ts lists the routes). */
@Injectable({ providedIn: 'root' })
export class PlansApi {
  private readonly http = inject(HttpClient);

  room(roomId: number): Observable<RoomDto> {
    return this.http.get<RoomDto>(`/api/rooms/${roomId}`);
  }

  createPlan(roomId: number, body: CreatePlanRequest): Observable<PlanDetail | PlanStarted> {
    return this.http.post<PlanDetail | PlanStarted>(`/api/rooms/${roomId}/plans`, body, OWN_ERRORS);
  }

  plans(roomId: number): Observable<PlanSummary[]> {
    return this.http.get<PlanSummary[]>(`/api/rooms/${roomId}/plans`);
  }

  plan(planId: number): Observable<PlanDetail> {
    return this.http.get<PlanDetail>(`/api/plans/${planId}`);
  }

  updatePlan(planId: number, body: { name?: string; chosen?: boolean }): Observable<PlanSummary> {
    return this.http.patch<PlanSummary>(`/api/plans/${planId}`, body);
  }

  deletePlan(planId: number): Observable<void> {
    return this.http.delete<void>(`/api/plans/${planId}`);
  }

  compare(a: number, b: number): Observable<PlanComparison> {
    return this.http.get<PlanComparison>('/api/plans/compare', { params: { a, b } });
  }

  sweep(roomId: number, maxK: number): Observable<KSweepResult> {
    return this.http.post<KSweepResult>(`/api/rooms/${roomId}/plans/sweep`, { maxK }, OWN_ERRORS);
  }

  briefing(planId: number): Observable<BriefingSheet> {
    return this.http.get<BriefingSheet>(`/api/plans/${planId}/briefing`);
  }

  limits(): Observable<ServerLimits> {
    return this.http.get<ServerLimits>('/api/jobs/limits');
  }

  job(jobId: number): Observable<JobDto> {
    return this.http.get<JobDto>(`/api/jobs/${jobId}`, QUIET);
  }

  /** keepBest: a running plan search stops and ends with its best plan so far instead of nothing. */
  cancelJob(jobId: number, keepBest = false): Observable<JobDto> {
    return this.http.post<JobDto>(`/api/jobs/${jobId}/cancel`, keepBest ? { keepBest: true } : {});
  }

  startRehearsal(planId: number, body: StartRehearsalRequest): Observable<RehearsalStarted> {
    return this.http.post<RehearsalStarted>(`/api/plans/${planId}/rehearsals`, body, OWN_ERRORS);
  }

  rehearsals(roomId: number, filter: { planId?: number | null; status?: string | null }): Observable<RehearsalSummary[]> {
    let params = new HttpParams();
    if (filter.planId) params = params.set('planId', filter.planId);
    if (filter.status) params = params.set('status', filter.status);
    return this.http.get<RehearsalSummary[]>(`/api/rooms/${roomId}/rehearsals`, { params, ...QUIET });
  }

  rehearsal(id: number): Observable<RehearsalDetail> {
    return this.http.get<RehearsalDetail>(`/api/rehearsals/${id}`);
  }

  cancelRehearsal(id: number): Observable<RehearsalSummary> {
    return this.http.post<RehearsalSummary>(`/api/rehearsals/${id}/cancel`, {});
  }

  rerun(id: number, idempotencyKey: string): Observable<RehearsalStarted> {
    return this.http.post<RehearsalStarted>(`/api/rehearsals/${id}/rerun`, { idempotencyKey });
  }
}

/** True when the create call answered with a background job rather than a finished plan. */
export function isStarted(r: PlanDetail | PlanStarted): r is PlanStarted {
  return 'job' in r && 'plan' in r;
}
