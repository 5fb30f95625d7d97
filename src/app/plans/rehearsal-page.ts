import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, DestroyRef, effect, inject, input, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import { concat, concatMap, defer, EMPTY, finalize, forkJoin, map, merge, type Observable, of, type Subscription, tap } from 'rxjs';
import {
  REHEARSAL_LIMITS,
  type PlanSummary,
  type RehearsalDetail,
  type RehearsalStarted,
  type RehearsalSummary,
} from '../../../shared/api/plans';
import { toApiError } from '../core/api-error';
import { shownByInterceptor } from '../core/error-interceptor';
import { jobEvents } from './job-events';
import { PlansApi } from './plans-api';
import { randomSeed, runsMessage, runsValidator, seedMessage, seedValidator } from './rehearsal-form-rules';
import { ShowWhenChanged } from './show-when-changed';
import { RehearsalHistory } from './rehearsal-history';
import { RehearsalResult } from './rehearsal-result';
import { rerunMatch, type RerunMatch } from './rerun-match';

interface Active {
  rehearsalId: number;
  progress: number;
  done: number | null;
  of: number;
  position: number | null;
  state: string;
}

/** Rehearsals of a room: start seeded cascades for a plan, follow them live, read and reproduce them. */
@Component({
  selector: 'app-rehearsal-page',
  imports: [
    DecimalPipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTooltipModule,
    RehearsalHistory,
    RehearsalResult,
  ],
  templateUrl: './rehearsal-page.html',
  styleUrl: './rehearsal-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class RehearsalPage {
  private readonly api = inject(PlansApi);
  private readonly router = inject(Router);
  readonly roomId = input.required<string>();
  /** Query parameters: the plan to rehearse and the rehearsal shown. */
  readonly plan = input<string>();
  readonly show = input<string>();

  protected readonly id = computed(() => Number(this.roomId()));
  protected readonly plans = signal<PlanSummary[]>([]);
  protected readonly cap = signal<number>(REHEARSAL_LIMITS.defaultRuns);
  protected readonly matcher = new ShowWhenChanged();
  protected readonly planId = new FormControl<number | null>(null);
  protected readonly runs = new FormControl<number | null>(
    REHEARSAL_LIMITS.defaultRuns,
    runsValidator(() => this.cap()),
  );
  protected readonly seed = new FormControl<string>(randomSeed(), { nonNullable: true, validators: seedValidator });
  /** A counter, so every change notifies (a repeated status such as INVALID -> INVALID must still refresh the messages). */
  private changeCount = 0;
  private readonly formChanges = toSignal(
    merge(this.runs.statusChanges, this.seed.statusChanges, this.runs.valueChanges, this.seed.valueChanges).pipe(
      map(() => ++this.changeCount),
    ),
    { initialValue: 0 },
  );
  protected readonly runsError = computed(() => (this.formChanges(), this.cap(), runsMessage(this.runs.errors)));
  protected readonly seedError = computed(() => (this.formChanges(), seedMessage(this.seed.errors)));
  protected readonly formInvalid = computed(() => (this.formChanges(), this.cap(), this.runs.invalid || this.seed.invalid));

  protected readonly active = signal<Active | null>(null);
  protected readonly detail = signal<RehearsalDetail | null>(null);
  protected readonly match = signal<RerunMatch | null>(null);
  protected readonly startError = signal<string | null>(null);
  protected readonly notice = signal<string | null>(null);
  protected readonly history = signal<RehearsalSummary[]>([]);
  protected readonly planFilter = signal<number | null>(null);
  protected readonly statusFilter = signal<string | null>(null);
  protected readonly readyPlans = computed(() => this.plans().filter((p) => p.status === 'ready'));
  protected readonly selectedPlan = computed(
    () => (this.formChanges(), this.planChoice(), this.readyPlans().find((p) => p.id === this.planId.value) ?? null),
  );
  private readonly planChoice = toSignal(this.planId.valueChanges, { initialValue: null });

  private starting = false;
  private idempotencyKey: string | null = null;
  private sub: Subscription | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.sub?.unsubscribe());
    merge(this.runs.valueChanges, this.seed.valueChanges, this.planId.valueChanges).subscribe(() => (this.idempotencyKey = null));
    effect(() => {
      const id = this.id();
      untracked(() => this.init(id));
    });
    effect(() => {
      const show = Number(this.show());
      untracked(() => this.display(show > 0 ? show : null));
    });
    effect(() => {
      this.planFilter();
      this.statusFilter();
      untracked(() => this.refreshHistory());
    });
  }

  private init(roomId: number): void {
    forkJoin([this.api.plans(roomId), this.api.limits()]).subscribe({
      next: ([plans, limits]) => this.ready(plans, limits.maxCascades),
      error: shownByInterceptor,
    });
  }

  /** The room's plans are in: picks the plan asked for, else the chosen one, else the first ready one. */
  private ready(plans: PlanSummary[], maxCascades: number): void {
    this.plans.set(plans);
    this.cap.set(maxCascades);
    this.runs.updateValueAndValidity();
    const wanted = Number(this.plan());
    const pick =
      plans.find((p) => p.id === wanted && p.status === 'ready') ??
      plans.find((p) => p.chosen && p.status === 'ready') ??
      plans.find((p) => p.status === 'ready');
    this.planId.setValue(pick?.id ?? null);
  }

  protected refreshHistory(): void {
    this.history$().subscribe({ error: shownByInterceptor });
  }

  /** The rehearsals of the room, as filtered (the filters are read when it runs). */
  private history$(): Observable<unknown> {
    if (!(this.id() > 0)) return of(null);
    return this.api.rehearsals(this.id(), { planId: this.planFilter(), status: this.statusFilter() }).pipe(tap((h) => this.history.set(h)));
  }

  protected newSeed(): void {
    this.seed.setValue(randomSeed());
  }

  protected start(): void {
    if (this.starting || this.active()) return;
    this.runs.markAsTouched();
    this.seed.markAsTouched();
    const planId = this.planId.value;
    if (!planId) {
      this.startError.set('Choose a plan to rehearse.');
      return;
    }
    if (this.runs.invalid || this.seed.invalid) return;
    this.starting = true;
    this.startError.set(null);
    this.idempotencyKey ??= crypto.randomUUID();
    this.api
      .startRehearsal(planId, { runs: this.runs.value!, seed: this.seed.value, idempotencyKey: this.idempotencyKey })
      .pipe(finalize(() => (this.starting = false)))
      .subscribe({
        next: (r) => this.began(r),
        error: (e: unknown) => this.startError.set(toApiError(e).message),
      });
  }

  protected rerunOf(r: RehearsalSummary): void {
    if (this.active()) return;
    this.startError.set(null);
    this.api.rerun(r.id, crypto.randomUUID()).subscribe({
      next: (started) => this.began(started),
      error: (e: unknown) => this.startError.set(toApiError(e).message),
    });
  }

  private began(r: RehearsalStarted): void {
    this.notice.set(r.reused ? 'That rehearsal had just been started: following it instead of starting a second one.' : null);
    this.detail.set(null);
    this.match.set(null);
    void this.router.navigate([], { queryParams: { plan: r.rehearsal.planId, show: r.rehearsal.id } });
    this.follow(r.rehearsal);
    this.refreshHistory();
  }

  /** Feeds the progress bar from the rehearsal's server-sent events. */
  private follow(r: RehearsalSummary): void {
    this.sub?.unsubscribe();
    this.active.set({ rehearsalId: r.id, progress: r.progress, done: null, of: r.runs, position: r.queuePosition, state: r.status });
    this.sub = jobEvents(`/api/rehearsals/${r.id}/events`).subscribe({
      next: (e) => {
        const a = this.active();
        if (!a) return;
        this.active.set({
          ...a,
          state: e.type,
          progress: e.fraction ?? e.job.progress,
          done: e.done ?? a.done,
          of: e.of ?? a.of,
          position: e.type === 'queued' ? (e.position ?? e.job.queuePosition) : null,
        });
        if (e.type === 'done') this.finished(r.id);
        else if (e.type === 'failed' || e.type === 'cancelled' || e.type === 'interrupted') {
          this.active.set(null);
          this.startError.set(
            e.type === 'cancelled'
              ? 'Rehearsal cancelled: nothing from it is shown as a result.'
              : e.type === 'interrupted'
                ? 'The server restarted during this rehearsal, so it was stopped. Re-run it from its seed.'
                : `The rehearsal failed: ${e.message ?? e.job.message ?? 'no reason given'}.`,
          );
          this.refreshHistory();
        }
      },
      error: (err: Error) => {
        this.active.set(null);
        this.startError.set(`${err.message} Reload the page to see where it stands.`);
      },
    });
  }

  private finished(id: number): void {
    this.active.set(null);
    this.idempotencyKey = null;
    // The history is read once the display has settled, whatever it showed.
    concat(
      this.display$(id, true),
      defer(() => this.history$()),
    ).subscribe({ error: shownByInterceptor });
  }

  protected cancel(): void {
    const a = this.active();
    if (a) this.api.cancelRehearsal(a.rehearsalId).subscribe({ error: shownByInterceptor });
  }

  protected display(id: number | null, force = false): void {
    this.display$(id, force).subscribe({ error: shownByInterceptor });
  }

  /** Shows a rehearsal: follows it while it runs, else its results (and how a re-run matches its original). */
  private display$(id: number | null, force = false): Observable<unknown> {
    if (id === null) return of(null);
    if (!force && (this.detail()?.id === id || this.active()?.rehearsalId === id)) return of(null);
    return this.api.rehearsal(id).pipe(
      concatMap((d) => {
        if (d.status === 'queued' || d.status === 'running') {
          this.follow(d);
          return EMPTY;
        }
        this.detail.set(d.status === 'done' ? d : null);
        this.match.set(null);
        if (d.status !== 'done') this.startError.set(`Rehearsal #${d.number} is ${d.status}: it has no results. ${d.message ?? ''}`);
        if (d.status !== 'done' || !d.rerunOf) return EMPTY;
        return this.api.rehearsal(d.rerunOf).pipe(
          tap((original) => {
            if (original.status === 'done') this.match.set(rerunMatch(original, d));
          }),
        );
      }),
    );
  }

  protected openRehearsal(id: number): void {
    void this.router.navigate([], { queryParams: { plan: this.planId.value, show: id } });
  }
}
