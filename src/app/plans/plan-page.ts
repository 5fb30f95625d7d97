import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  inject,
  input,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { PercentPipe } from '@angular/common';
import { finalize, forkJoin, switchMap, type Subscription } from 'rxjs';
import type { CreatePlanRequest, PlanDetail, PlanSearchProgress, PlanSummary } from '../../../shared/api/plans';
import { PLAN_LIMITS } from '../../../shared/api/plans';
import type { RoomDto } from '../../../shared/api/rooms';
import { toApiError } from '../core/api-error';
import { shownByInterceptor } from '../core/error-interceptor';
import { jobEvents } from './job-events';
import { PlanFormPanel, type ServerProblem } from './plan-form-panel';
import { PlanProgress } from './plan-progress';
import { PlanResult } from './plan-result';
import { isStarted, PlansApi } from './plans-api';
import { SavedPlans } from './saved-plans';
import { SweepPanel } from './sweep-panel';

/** A background proof of the shown plan's problem: its progress and the best lower bound proven so far. */
interface ProofState {
  jobId: number;
  planId: number;
  progress: number;
  lowerBound: number | null;
}

interface JobState {
  progress: number;
  position: number | null;
  jobId: number;
  search: PlanSearchProgress | null;
  people: number;
  k: number;
}

/** The plan screen of a room: ask for a plan, read the result, keep and compare plans. */
@Component({
  selector: 'app-plan-page',
  imports: [
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatTooltipModule,
    PercentPipe,
    PlanFormPanel,
    PlanProgress,
    PlanResult,
    SavedPlans,
    SweepPanel,
  ],
  templateUrl: './plan-page.html',
  styleUrl: './plan-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class PlanPage {
  private readonly api = inject(PlansApi);
  private readonly router = inject(Router);
  private readonly snack = inject(MatSnackBar);
  /** Route parameter of the parent path rooms/:roomId/plans. */
  readonly roomId = input.required<string>();
  /** Query parameter: the plan shown. */
  readonly plan = input<string>();

  protected readonly id = computed(() => Number(this.roomId()));
  protected readonly exhaustiveMax = PLAN_LIMITS.exhaustiveMaxPeople;
  protected readonly room = signal<RoomDto | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly plans = signal<PlanSummary[]>([]);
  protected readonly shown = signal<PlanDetail | null>(null);
  protected readonly pending = signal(false);
  protected readonly serverError = signal<ServerProblem | null>(null);
  protected readonly job = signal<JobState | null>(null);
  protected readonly proof = signal<ProofState | null>(null);
  /** The shown plan's background proof ended while the page was open (the result line says how). */
  protected readonly proofEnded = signal(false);
  /** The shown plan's gap to best as a share of its total, with what a running background proof proved so far. */
  protected readonly liveGap = computed(() => {
    const p = this.shown();
    if (!p || p.total === null || p.total <= 0) return null;
    const lb = Math.max(p.lowerBound ?? 0, this.proof()?.lowerBound ?? 0);
    return p.certified ? 0 : Math.max(0, (p.total - Math.min(lb, p.total)) / p.total);
  });
  private readonly form = viewChild(PlanFormPanel);
  private jobSub: Subscription | null = null;
  private proofSub: Subscription | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      this.jobSub?.unsubscribe();
      this.proofSub?.unsubscribe();
    });
    effect(() => {
      const id = this.id();
      untracked(() => void this.loadRoom(id));
    });
    effect(() => {
      const planId = Number(this.plan());
      untracked(() => void this.showPlan(Number.isInteger(planId) && planId > 0 ? planId : null));
    });
  }

  private loadRoom(id: number): void {
    if (!Number.isInteger(id) || id <= 0) {
      this.loadError.set('This address does not name a room.');
      return;
    }
    this.api
      .room(id)
      .pipe(
        switchMap((room) => {
          this.room.set(room);
          return this.api.plans(id);
        }),
      )
      .subscribe({ next: (plans) => this.plans.set(plans), error: (e: unknown) => this.loadError.set(toApiError(e).message) });
  }

  protected refreshPlans(): void {
    this.api.plans(this.id()).subscribe({ next: (plans) => this.plans.set(plans), error: shownByInterceptor });
  }

  /**
   * Puts the plan the create call just answered with at the top of the saved list (newest first,
   * as the server lists them), or replaces its row: no second request for the list.
   */
  private keepInList(made: PlanDetail | PlanSummary): void {
    const { perPerson: _people, reach: _reach, proving: _proving, fasterPlanId: _faster, searchSoFar: _so, ...row } = made as PlanDetail;
    this.plans.update((list) => (list.some((p) => p.id === row.id) ? list.map((p) => (p.id === row.id ? row : p)) : [row, ...list]));
  }

  private showPlan(planId: number | null): void {
    if (planId === null) {
      this.shown.set(null);
      return;
    }
    if (this.shown()?.id === planId) return;
    this.api.plan(planId).subscribe({
      next: (p) => {
        this.present(p);
        if (p.status === 'computing' && p.jobId) this.follow(p.jobId, p.id, p.k);
      },
      error: () => this.shown.set(null),
    });
  }

  protected makePlan(request: CreatePlanRequest): void {
    this.pending.set(true);
    this.serverError.set(null);
    this.api
      .createPlan(this.id(), request)
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: (r) => {
          if (isStarted(r)) {
            this.follow(r.job.id, r.plan.id, r.plan.k);
            this.keepInList(r.plan);
          } else {
            this.present(r);
            this.open(r.id);
            this.keepInList(r);
          }
        },
        error: (e: unknown) => {
          const err = toApiError(e);
          const suggest = err.details?.['suggest'];
          const field = typeof err.details?.['field'] === 'string' ? (err.details['field'] as string) : null;
          this.serverError.set({ message: suggest ? `${err.message} Try “${suggest}”.` : err.message, field });
        },
      });
  }

  /**
   * Follows a background plan's progress (the bar, the best total and the proven gap so far); when
   * done, `onDone` runs (by default: open the new plan).
   */
  private follow(jobId: number, planId: number, k: number, onDone: (planId: number) => void = (id) => this.openFresh(id)): void {
    this.jobSub?.unsubscribe();
    this.job.set({ progress: 0, position: null, jobId, search: null, people: this.room()?.people.length ?? 0, k });
    this.jobSub = jobEvents(`/api/jobs/${jobId}/events`).subscribe({
      next: (e) => {
        const before = this.job();
        this.job.set({
          jobId,
          progress: Math.max(before?.progress ?? 0, e.fraction ?? e.job.progress),
          position: e.type === 'queued' ? (e.position ?? e.job.queuePosition) : null,
          search: e.search ?? before?.search ?? null,
          people: before?.people ?? 0,
          k,
        });
        if (e.type === 'done') {
          this.job.set(null);
          onDone(planId);
          this.refreshPlans();
        } else if (e.type === 'failed' || e.type === 'cancelled' || e.type === 'interrupted') {
          this.job.set(null);
          this.serverError.set({ message: e.message ?? e.job.message ?? `The plan was ${e.type}.`, field: null });
          this.refreshPlans();
        }
      },
      error: (err: Error) => {
        this.job.set(null);
        this.serverError.set({ message: err.message, field: null });
      },
    });
  }

  /** Shows a plan and, while a background search goes on proving its problem, follows that search. */
  private present(p: PlanDetail): void {
    this.shown.set(p);
    if (this.proof()?.planId === p.id) return;
    this.proofSub?.unsubscribe();
    this.proofSub = null;
    this.proof.set(null);
    this.proofEnded.set(false);
    if (p.proving) this.followProof(p.proving.jobId, p.id, p.proving.progress);
  }

  /** Live: the bar and the gap shrinking as the background search proves more; at the end the plan is read again. */
  private followProof(jobId: number, planId: number, progress: number): void {
    this.proof.set({ jobId, planId, progress, lowerBound: null });
    this.proofSub = jobEvents(`/api/jobs/${jobId}/events`).subscribe({
      next: (e) => {
        const before = this.proof();
        if (!before || before.jobId !== jobId) return;
        if (e.type === 'queued' || e.type === 'started' || e.type === 'progress') {
          const lb = e.search?.lowerBound ?? null;
          this.proof.set({
            ...before,
            progress: Math.max(before.progress, e.fraction ?? e.job.progress),
            lowerBound: lb === null ? before.lowerBound : Math.max(lb, before.lowerBound ?? lb),
          });
          return;
        }
        this.proofFinished(planId);
      },
      error: () => this.proofFinished(planId),
    });
  }

  private proofFinished(planId: number): void {
    this.proof.set(null);
    this.proofSub = null;
    if (this.shown()?.id !== planId) return;
    this.api.plan(planId).subscribe({
      next: (fresh) => {
        if (this.shown()?.id !== planId) return;
        this.shown.set(fresh);
        this.proofEnded.set(true);
        this.refreshPlans();
      },
      error: shownByInterceptor,
    });
  }

  /** Stops the background search; it keeps what it proved, and "Keep proving" continues it. */
  protected stopProof(): void {
    const pr = this.proof();
    if (pr) this.api.cancelJob(pr.jobId, true).subscribe({ error: shownByInterceptor });
  }

  private openFresh(planId: number): void {
    this.shown.set(null);
    this.open(planId);
  }

  /**
   * Runs the full search for the shown plan's problem (same k and constraints). Its proven bound
   * is shared, so the shown plan's gap updates; if the search finds a faster plan, that one opens.
   */
  protected proveShown(p: PlanDetail): void {
    this.serverError.set(null);
    const done = (id: number) =>
      forkJoin([this.api.plan(id), this.api.plan(p.id)]).subscribe({
        next: ([found, mine]) => {
          if (found.total !== null && mine.total !== null && found.total < mine.total * (1 - 1e-9)) this.openFresh(id);
          else this.present(mine);
        },
        error: shownByInterceptor,
      });
    this.api
      .createPlan(this.id(), {
        k: p.k,
        method: 'exhaustive',
        mustBrief: p.mustBrief,
        cannotBrief: p.cannotBrief,
        ...(p.noShow ? { noShow: p.noShow } : {}),
        timeLimitSeconds: 60,
        background: true,
        name: `${p.name} · full search`,
      })
      .subscribe({
        next: (r) => {
          if (isStarted(r)) this.follow(r.job.id, r.plan.id, p.k, done);
          else done(r.id);
          this.keepInList(isStarted(r) ? r.plan : r);
        },
        error: (e: unknown) => this.serverError.set({ message: toApiError(e).message, field: null }),
      });
  }

  /** keepBest: a running search stops and its best plan so far opens when the job ends. */
  protected cancelJob(keepBest = false): void {
    const j = this.job();
    if (j) this.api.cancelJob(j.jobId, keepBest).subscribe({ error: shownByInterceptor });
  }

  /** Shows a plan by its address (the router's navigation is the browser's own promise). */
  protected open(planId: number): void {
    void this.router.navigate([], { queryParams: { plan: planId }, replaceUrl: false });
  }

  protected toggleChosen(p: PlanSummary): void {
    this.api.updatePlan(p.id, { chosen: !p.chosen }).subscribe({
      next: () => {
        this.snack.open(p.chosen ? `${p.name} is no longer the chosen plan.` : `${p.name} is now the chosen plan.`, 'OK', {
          duration: 4000,
        });
        this.refreshPlans();
        const s = this.shown();
        if (s) this.shown.set({ ...s, chosen: s.id === p.id ? !p.chosen : false });
      },
      error: shownByInterceptor,
    });
  }

  protected remove(p: PlanSummary): void {
    if (!confirm(`Delete the plan “${p.name}” and its rehearsals?`)) return;
    this.api.deletePlan(p.id).subscribe({
      next: () => {
        if (this.shown()?.id === p.id) void this.router.navigate([], { queryParams: {} });
        this.refreshPlans();
      },
      error: shownByInterceptor,
    });
  }

  /** Plans the same budget and constraints with plain greedy, then opens the comparison. */
  protected compareWithGreedy(p: PlanDetail): void {
    this.pending.set(true);
    this.api
      .createPlan(this.id(), { k: p.k, method: 'greedy', mustBrief: p.mustBrief, cannotBrief: p.cannotBrief, name: `${p.name} · greedy` })
      .subscribe({
        next: (r) => {
          const other = isStarted(r) ? r.plan : r;
          void this.router
            .navigate(['/rooms', this.id(), 'plans', 'compare'], { queryParams: { a: p.id, b: other.id } })
            .finally(() => this.pending.set(false));
        },
        error: (e: unknown) => {
          this.serverError.set({ message: toApiError(e).message, field: null });
          this.pending.set(false);
        },
      });
  }

  protected planAgain(p: PlanDetail): void {
    this.form()?.prefill(
      p.kind === 'hand-made'
        ? { starters: p.starters.map((s) => s.personId) }
        : {
            k: p.k,
            method: p.methodRequested === 'hand-made' ? 'auto' : p.methodRequested,
            mustBrief: p.mustBrief,
            cannotBrief: p.cannotBrief,
          },
    );
  }

  protected readonly naming = signal(false);

  protected rename(p: PlanDetail, raw: string): void {
    const name = raw.trim();
    this.naming.set(false);
    if (!name || name === p.name) return;
    this.api.updatePlan(p.id, { name }).subscribe({
      next: (s) => {
        this.shown.set({ ...p, name: s.name });
        this.refreshPlans();
      },
      error: shownByInterceptor,
    });
  }
}
