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
import { DecimalPipe } from '@angular/common';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom, type Subscription } from 'rxjs';
import type { CreatePlanRequest, PlanDetail, PlanSummary } from '../../../shared/api/plans';
import type { RoomDto } from '../../../shared/api/rooms';
import { toApiError } from '../core/api-error';
import { jobEvents } from './job-events';
import { PlanFormPanel } from './plan-form-panel';
import { PlanResult } from './plan-result';
import { isStarted, PlansApi } from './plans-api';
import { SavedPlans } from './saved-plans';
import { SweepPanel } from './sweep-panel';

/** The plan screen of a room: ask for a plan, read the result, keep and compare plans. */
@Component({
  selector: 'app-plan-page',
  imports: [
    DecimalPipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    PlanFormPanel,
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
  protected readonly room = signal<RoomDto | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly plans = signal<PlanSummary[]>([]);
  protected readonly shown = signal<PlanDetail | null>(null);
  protected readonly pending = signal(false);
  protected readonly serverError = signal<string | null>(null);
  protected readonly job = signal<{ progress: number; position: number | null; jobId: number } | null>(null);
  private readonly form = viewChild(PlanFormPanel);
  private jobSub: Subscription | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.jobSub?.unsubscribe());
    effect(() => {
      const id = this.id();
      untracked(() => void this.loadRoom(id));
    });
    effect(() => {
      const planId = Number(this.plan());
      untracked(() => void this.showPlan(Number.isInteger(planId) && planId > 0 ? planId : null));
    });
  }

  private async loadRoom(id: number): Promise<void> {
    if (!Number.isInteger(id) || id <= 0) {
      this.loadError.set('This address does not name a room.');
      return;
    }
    try {
      this.room.set(await firstValueFrom(this.api.room(id)));
      await this.refreshPlans();
    } catch (e) {
      this.loadError.set(toApiError(e).message);
    }
  }

  protected async refreshPlans(): Promise<void> {
    this.plans.set(await firstValueFrom(this.api.plans(this.id())));
  }

  private async showPlan(planId: number | null): Promise<void> {
    if (planId === null) {
      this.shown.set(null);
      return;
    }
    if (this.shown()?.id === planId) return;
    try {
      const p = await firstValueFrom(this.api.plan(planId));
      this.shown.set(p);
      if (p.status === 'computing' && p.jobId) this.follow(p.jobId, p.id);
    } catch {
      this.shown.set(null);
    }
  }

  protected async makePlan(request: CreatePlanRequest): Promise<void> {
    this.pending.set(true);
    this.serverError.set(null);
    try {
      const r = await firstValueFrom(this.api.createPlan(this.id(), request));
      if (isStarted(r)) {
        this.follow(r.job.id, r.plan.id);
      } else {
        this.shown.set(r);
        await this.open(r.id);
      }
      await this.refreshPlans();
    } catch (e) {
      const err = toApiError(e);
      const suggest = err.details?.['suggest'];
      this.serverError.set(suggest ? `${err.message} Try “${suggest}”.` : err.message);
    } finally {
      this.pending.set(false);
    }
  }

  /** Follows a background plan's progress; opens it when done. */
  private follow(jobId: number, planId: number): void {
    this.jobSub?.unsubscribe();
    this.job.set({ progress: 0, position: null, jobId });
    this.jobSub = jobEvents(`/api/jobs/${jobId}/events`).subscribe({
      next: (e) => {
        this.job.set({
          jobId,
          progress: e.fraction ?? e.job.progress,
          position: e.type === 'queued' ? (e.position ?? e.job.queuePosition) : null,
        });
        if (e.type === 'done') {
          this.job.set(null);
          this.shown.set(null);
          void this.open(planId).then(() => this.refreshPlans());
        } else if (e.type === 'failed' || e.type === 'cancelled' || e.type === 'interrupted') {
          this.job.set(null);
          this.serverError.set(e.message ?? e.job.message ?? `The plan was ${e.type}.`);
          void this.refreshPlans();
        }
      },
      error: (err: Error) => {
        this.job.set(null);
        this.serverError.set(err.message);
      },
    });
  }

  protected async cancelJob(): Promise<void> {
    const j = this.job();
    if (j) await firstValueFrom(this.api.cancelJob(j.jobId));
  }

  protected async open(planId: number): Promise<void> {
    await this.router.navigate([], { queryParams: { plan: planId }, replaceUrl: false });
  }

  protected async toggleChosen(p: PlanSummary): Promise<void> {
    await firstValueFrom(this.api.updatePlan(p.id, { chosen: !p.chosen }));
    this.snack.open(p.chosen ? `${p.name} is no longer the chosen plan.` : `${p.name} is now the chosen plan.`, 'OK', { duration: 4000 });
    await this.refreshPlans();
    const s = this.shown();
    if (s) this.shown.set({ ...s, chosen: s.id === p.id ? !p.chosen : false });
  }

  protected async remove(p: PlanSummary): Promise<void> {
    if (!confirm(`Delete the plan “${p.name}” and its rehearsals?`)) return;
    await firstValueFrom(this.api.deletePlan(p.id));
    if (this.shown()?.id === p.id) await this.router.navigate([], { queryParams: {} });
    await this.refreshPlans();
  }

  /** Plans the same budget and constraints with plain greedy, then opens the comparison. */
  protected async compareWithGreedy(p: PlanDetail): Promise<void> {
    this.pending.set(true);
    try {
      const r = await firstValueFrom(
        this.api.createPlan(this.id(), {
          k: p.k,
          method: 'greedy',
          mustBrief: p.mustBrief,
          cannotBrief: p.cannotBrief,
          name: `${p.name} · greedy`,
        }),
      );
      const other = isStarted(r) ? r.plan : r;
      await this.router.navigate(['/rooms', this.id(), 'plans', 'compare'], { queryParams: { a: p.id, b: other.id } });
    } catch (e) {
      this.serverError.set(toApiError(e).message);
    } finally {
      this.pending.set(false);
    }
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

  protected async rename(p: PlanDetail, raw: string): Promise<void> {
    const name = raw.trim();
    this.naming.set(false);
    if (!name || name === p.name) return;
    const s = await firstValueFrom(this.api.updatePlan(p.id, { name }));
    this.shown.set({ ...p, name: s.name });
    await this.refreshPlans();
  }
}
