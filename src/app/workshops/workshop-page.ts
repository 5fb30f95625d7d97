import { ChangeDetectionStrategy, Component, computed, inject, input, type OnDestroy, type OnInit, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { catchError, concatMap, defer, forkJoin, from, type Observable, of, tap } from 'rxjs';
import { REHEARSAL_LIMITS, type RehearsalSummary } from '../../../shared/api/plans';
import {
  BUILD_MODES,
  NOMINATION_LIMIT_MAX,
  STATUS_LABELS,
  WORKSHOP_STATUSES,
  type BuildMode,
  type BuildResult,
  type MissingAnswer,
  type SurveyProgress,
  type WorkshopDetail,
  type WorkshopStatus,
} from '../../../shared/api/workshops';
import { toApiError } from '../core/api-error';
import { type ConfirmData, whenConfirmed } from '../core/confirm-dialog';
import { shownByInterceptor } from '../core/error-interceptor';
import { LinkSheetStore } from './link-sheet-store';
import { WorkshopsApi } from './workshops-api';
import { DateTimePipe, DayPipe } from '../core/date-format';

/** One workshop: status, facilitators, participants and links, live survey count, room build, debrief. */
@Component({
  selector: 'app-workshop-page',
  imports: [
    DateTimePipe,
    DayPipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
  ],
  templateUrl: './workshop-page.html',
  styleUrl: './workshops.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class WorkshopPage implements OnInit, OnDestroy {
  readonly id = input.required<string>();
  private readonly api = inject(WorkshopsApi);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly sheet = inject(LinkSheetStore);
  private readonly dialog = inject(MatDialog);

  protected readonly labels = STATUS_LABELS;
  protected readonly steps = WORKSHOP_STATUSES;
  protected readonly modes = BUILD_MODES;
  protected readonly sampleChoices = Array.from({ length: REHEARSAL_LIMITS.samples }, (_, i) => i);
  protected readonly w = signal<WorkshopDetail | null>(null);
  protected readonly progress = signal<SurveyProgress | null>(null);
  protected readonly mode = signal<BuildMode>('either');
  protected readonly missing = signal<MissingAnswer[]>([]);
  protected readonly built = signal<BuildResult | null>(null);
  protected readonly rehearsals = signal<RehearsalSummary[]>([]);
  protected readonly rosterIssues = signal<{ line: number; message: string }[]>([]);
  protected readonly personForm = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(120)] }),
    email: new FormControl('', { nonNullable: true, validators: [Validators.email] }),
  });
  protected readonly facilitatorForm = new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.email] }),
  });
  protected readonly releaseForm = new FormGroup({
    rehearsalId: new FormControl<number | null>(null, Validators.required),
    sampleRun: new FormControl(0, { nonNullable: true }),
    showStarters: new FormControl(false, { nonNullable: true }),
  });
  protected readonly settingsForm = new FormGroup({
    nominationLimit: new FormControl(5, {
      nonNullable: true,
      validators: [Validators.required, Validators.min(1), Validators.max(NOMINATION_LIMIT_MAX)],
    }),
    linkDays: new FormControl(30, { nonNullable: true, validators: [Validators.required, Validators.min(1), Validators.max(365)] }),
  });
  protected readonly limitMax = NOMINATION_LIMIT_MAX;
  protected readonly doneRehearsals = computed(() => this.rehearsals().filter((r) => r.status === 'done'));
  /** Participants ticked for a reissue of their links. */
  protected readonly chosen = signal<ReadonlySet<number>>(new Set());
  protected readonly stepIndex = computed(() => WORKSHOP_STATUSES.indexOf(this.w()?.status ?? 'draft'));
  private timer: ReturnType<typeof setInterval> | undefined;
  private workshopId = 0;

  ngOnInit(): void {
    this.workshopId = Number(this.id());
    this.open();
  }

  ngOnDestroy(): void {
    clearInterval(this.timer);
  }

  private open(): void {
    this.reload().subscribe({
      // Live survey count: a light poll every 3 s (the shell's busy bar ignores it).
      complete: () => {
        this.timer = setInterval(() => this.poll().subscribe(), 3000);
      },
      error: shownByInterceptor,
    });
  }

  /** Everything at once: the detail, the live count, the missing answers and the rehearsals. */
  private reload(): Observable<unknown> {
    return forkJoin([this.api.detail(this.workshopId), this.poll(), this.loadMissing()]).pipe(
      tap(([w]) => this.show(w)),
      concatMap(() => this.loadRehearsals()),
    );
  }

  private show(w: WorkshopDetail): void {
    this.w.set(w);
    const ids = new Set(w.participants.map((p) => p.id));
    this.chosen.update((c) => new Set([...c].filter((id) => ids.has(id))));
    this.releaseForm.controls.showStarters.setValue(w.showStarters);
    if (this.settingsForm.pristine) this.settingsForm.reset({ nominationLimit: w.nominationLimit, linkDays: w.linkDays });
  }

  /** After a change to the participants: the fresh detail first, then the rest without waiting. */
  private refreshParticipants(): Observable<unknown> {
    return this.api.detail(this.workshopId).pipe(
      tap((w) => {
        this.show(w);
        this.refreshCounts();
      }),
    );
  }

  /** The live count and the missing answers, in the background (a failure leaves them as they were). */
  private refreshCounts(): void {
    this.poll().subscribe();
    this.loadMissing().subscribe({ error: () => undefined });
  }

  /** The live count; never fails (a missed poll keeps the last count). */
  private poll(): Observable<unknown> {
    return this.api.progress(this.workshopId).pipe(
      tap((p) => this.progress.set(p)),
      catchError(() => of(null)),
    );
  }

  private loadMissing(): Observable<unknown> {
    return this.api.missing(this.workshopId, this.mode()).pipe(tap((m) => this.missing.set(m)));
  }

  /** The room's rehearsals (read when subscribed, so a room just built counts); never fails. */
  private loadRehearsals(): Observable<unknown> {
    return defer(() => {
      const roomId = this.w()?.roomId;
      if (!roomId) return of(null);
      return this.api.rehearsals(roomId).pipe(
        catchError(() => of([])),
        tap((r) => this.rehearsals.set(r)),
      );
    });
  }

  /** Runs a change; its failure has been shown by the error interceptor. */
  private run(change: Observable<unknown>): void {
    change.subscribe({ error: shownByInterceptor });
  }

  protected move(to: WorkshopStatus): void {
    const ask = this.moveQuestion(to);
    const moved = this.api.move(this.workshopId, to).pipe(
      tap((w) => this.show(w)),
      concatMap(() => this.poll()),
    );
    this.run(ask ? whenConfirmed(this.dialog, ask).pipe(concatMap(() => moved)) : moved);
  }

  /** What to ask before a move that cannot simply be taken back; null when there is nothing to ask. */
  private moveQuestion(to: WorkshopStatus): ConfirmData | null {
    if (to === 'closed')
      return {
        title: 'Close the workshop?',
        message: 'A closed workshop cannot be reopened or changed. Participants keep seeing what was released to them.',
        confirm: 'Close the workshop',
        danger: true,
      };
    if (to === 'running' && this.w()?.status === 'collecting') {
      const p = this.progress();
      const waiting = p ? p.participants - p.answered : 0;
      return {
        title: 'Close the survey and run?',
        message:
          (p && waiting > 0 ? `${waiting} of ${p.participants} have not answered yet. ` : 'Everyone has answered. ') +
          'Once closed, nobody can send or change answers and the QR code stops taking names. You can reopen the survey later.',
        confirm: 'Close the survey',
      };
    }
    return null;
  }

  protected addFacilitator(): void {
    if (this.facilitatorForm.invalid) return;
    this.run(
      this.api.addFacilitator(this.workshopId, this.facilitatorForm.getRawValue().email).pipe(
        tap((w) => {
          this.show(w);
          this.facilitatorForm.reset();
        }),
      ),
    );
  }

  protected removeFacilitator(userId: number): void {
    this.run(this.api.removeFacilitator(this.workshopId, userId).pipe(concatMap(() => this.reload())));
  }

  protected addPerson(): void {
    if (this.personForm.invalid) return;
    const { name, email } = this.personForm.getRawValue();
    this.run(
      this.api.addPeople(this.workshopId, [{ name, email: email || null }]).pipe(
        tap((r) => {
          if (r.skipped.length) this.snack.open(`${r.skipped.join(', ')} is already on the list.`, 'OK', { duration: 5000 });
          this.personForm.reset();
          this.show(r.workshop);
          this.refreshCounts();
        }),
      ),
    );
  }

  protected uploadRoster(input: HTMLInputElement): void {
    const file = input.files?.[0];
    if (!file) return;
    const sent = from(file.text()).pipe(
      concatMap((csv) => {
        input.value = '';
        return this.api.roster(this.workshopId, csv);
      }),
      tap((r) => {
        this.rosterIssues.set(r.issues);
        this.snack.open(`${r.added} added${r.skipped.length ? `, ${r.skipped.length} already listed` : ''}.`, 'OK', { duration: 5000 });
      }),
      catchError((err: unknown) => {
        const e = toApiError(err);
        this.rosterIssues.set((e.details?.['issues'] as { line: number; message: string }[]) ?? []);
        return of(null);
      }),
    );
    this.run(sent.pipe(concatMap(() => this.refreshParticipants())));
  }

  protected fromRoom(): void {
    this.run(
      this.api.fromRoom(this.workshopId).pipe(
        tap((r) => this.snack.open(`${r.added} people taken from the room.`, 'OK', { duration: 4000 })),
        concatMap(() => this.refreshParticipants()),
      ),
    );
  }

  protected removeParticipant(pid: number, name: string): void {
    const ask: ConfirmData = {
      title: `Remove ${name}?`,
      message: `${name} leaves the workshop: their link stops working and their answers are deleted.`,
      confirm: 'Remove and delete answers',
      danger: true,
    };
    this.run(
      whenConfirmed(this.dialog, ask).pipe(
        concatMap(() => this.api.removeParticipant(this.workshopId, pid)),
        concatMap(() => this.refreshParticipants()),
      ),
    );
  }

  protected resetClaim(pid: number): void {
    this.run(
      this.api.resetClaim(this.workshopId, pid).pipe(
        tap(() => this.snack.open('The name can be picked again; the earlier link no longer works.', 'OK', { duration: 5000 })),
        concatMap(() => this.refreshParticipants()),
      ),
    );
  }

  protected revoke(pid: number, name: string): void {
    const ask: ConfirmData = {
      title: `End ${name}'s link?`,
      message: `The link ${name} holds (e-mailed, printed or picked on the join page) stops working at once. Their answers are kept. They get no new link until you print or e-mail one.`,
      confirm: 'End the link',
      danger: true,
    };
    this.run(
      whenConfirmed(this.dialog, ask).pipe(
        concatMap(() => this.api.revoke(this.workshopId, [pid])),
        concatMap(() => this.refreshParticipants()),
      ),
    );
  }

  protected toggleChosen(pid: number, on: boolean): void {
    this.chosen.update((c) => {
      const next = new Set(c);
      if (on) next.add(pid);
      else next.delete(pid);
      return next;
    });
  }

  protected chooseAll(on: boolean): void {
    this.chosen.set(new Set(on ? (this.w()?.participants ?? []).map((p) => p.id) : []));
  }

  /** The separate, confirmed action that replaces links: only the chosen people's links end. */
  protected reissue(ids: number[]): void {
    const w = this.w();
    if (!w || !ids.length) return;
    const names = w.participants.filter((p) => ids.includes(p.id)).map((p) => p.name);
    const who = names.length === 1 ? names[0] : `${names.length} people`;
    const ask: ConfirmData = {
      title: names.length === 1 ? `Reissue ${names[0]}'s link?` : `Reissue links for ${names.length} people?`,
      message:
        `The link ${names.length === 1 ? 'this person holds' : 'each of them holds'} stops working at once, including links already e-mailed or printed. ` +
        `Answers are kept and open with the new link. Everyone else keeps their link. Then print or e-mail the new ${names.length === 1 ? 'link' : 'links'} to ${who}.`,
      confirm: names.length === 1 ? 'Reissue the link' : `Reissue ${names.length} links`,
      danger: true,
    };
    this.run(
      whenConfirmed(this.dialog, ask).pipe(
        concatMap(() => this.api.reissue(this.workshopId, ids)),
        tap((links) => {
          this.chosen.set(new Set());
          this.sheet.links.set({ workshopId: this.workshopId, title: w.title, links, reissued: true });
          const ref = this.snack.open(
            `New ${links.length === 1 ? 'link' : 'links'} for ${who}; the old ones no longer work.`,
            'Print them',
            {
              duration: 10000,
            },
          );
          ref.onAction().subscribe(() => void this.router.navigate(['/workshops', this.workshopId, 'sheet']));
        }),
        concatMap(() => this.refreshParticipants()),
      ),
    );
  }

  protected emailLinks(): void {
    this.run(
      this.api.email(this.workshopId).pipe(
        tap((r) => {
          const parts = [`Sent to ${r.sent.length}.`];
          if (r.withoutEmail.length) parts.push(`${r.withoutEmail.length} without an address: print their links or use the QR code.`);
          if (r.failed.length) parts.push(`Could not send to ${r.failed.join(', ')}; their links are unchanged.`);
          this.snack.open(parts.join(' '), 'OK', { duration: 8000 });
        }),
        concatMap(() => this.refreshParticipants()),
      ),
    );
  }

  protected printSheet(): void {
    this.sheet.links.set(null);
    void this.router.navigate(['/workshops', this.workshopId, 'sheet']);
  }

  protected setMode(mode: BuildMode): void {
    this.mode.set(mode);
    this.run(this.loadMissing());
  }

  protected build(): void {
    this.run(
      this.api.build(this.workshopId, this.mode()).pipe(
        tap((r) => {
          this.built.set(r);
          this.missing.set(r.missing);
        }),
        concatMap(() => this.api.detail(this.workshopId)),
        tap((w) => this.show(w)),
        concatMap(() => this.loadRehearsals()),
      ),
    );
  }

  protected release(): void {
    const v = this.releaseForm.getRawValue();
    if (v.rehearsalId === null) return;
    this.run(
      this.api.release(this.workshopId, { rehearsalId: v.rehearsalId, sampleRun: v.sampleRun, showStarters: v.showStarters }).pipe(
        tap((w) => {
          this.show(w);
          this.snack.open('Results released: participants now see their debrief on their own link.', 'OK', { duration: 6000 });
        }),
      ),
    );
  }

  protected toggleStarters(show: boolean): void {
    this.run(this.api.patch(this.workshopId, { showStarters: show }).pipe(tap((w) => this.show(w))));
  }

  protected saveSettings(): void {
    if (this.settingsForm.invalid) return;
    this.run(
      this.api.patch(this.workshopId, this.settingsForm.getRawValue()).pipe(
        tap((w) => {
          this.settingsForm.markAsPristine();
          this.show(w);
          this.snack.open('Settings saved.', 'OK', { duration: 3000 });
        }),
      ),
    );
  }

  protected deleteWorkshop(): void {
    const w = this.w();
    if (!w) return;
    const ask: ConfirmData = {
      title: `Delete “${w.title}”?`,
      message: 'Its participants, their links and every survey answer are deleted. The room stays.',
      confirm: 'Delete the workshop',
      danger: true,
    };
    this.run(
      whenConfirmed(this.dialog, ask).pipe(
        concatMap(() => this.api.remove(this.workshopId)),
        concatMap(() => {
          this.snack.open('The workshop and all its survey data are deleted.', 'OK', { duration: 5000 });
          return from(this.router.navigate(['/workshops']));
        }),
      ),
    );
  }

  protected refreshRehearsals(): void {
    this.run(this.loadRehearsals());
  }
}
