import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, type AbstractControl, type ValidationErrors } from '@angular/forms';
import { SURVEY_LEVELS, type Nomination, type SurveyLevel, type SurveyState } from '../../../shared/api/workshops';
import { finalize } from 'rxjs';
import { type ApiError, toApiError } from '../core/api-error';
import { ParticipantApi } from './participant-api';

type Pick = SurveyLevel | '';
const EMPTY_MESSAGE = 'Pick at least one person you ask, or choose “I talk to nobody here regularly” if that is your answer.';

/** At most `limit` people picked; each pick needs a level (a picked row always has one). */
export function pickLimit(limit: number) {
  return (group: AbstractControl): ValidationErrors | null => {
    const picked = Object.values((group as FormGroup).controls).filter((c) => c.value).length;
    return picked > limit ? { tooMany: { picked, limit } } : null;
  };
}

/** "Whom do you usually ask?": tap a name to pick it, then say how often. Phone first. */
@Component({
  selector: 'app-survey-form',
  imports: [ReactiveFormsModule],
  templateUrl: './survey-form.html',
  styleUrl: './survey-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SurveyForm {
  readonly token = input.required<string>();
  readonly state = input.required<SurveyState>();
  readonly saved = output<SurveyState>();
  private readonly api = inject(ParticipantApi);

  protected readonly levels = SURVEY_LEVELS;
  protected readonly form = signal(new FormGroup<Record<string, FormControl<Pick>>>({}));
  protected readonly filter = new FormControl('', { nonNullable: true });
  private readonly filterText = toSignal(this.filter.valueChanges, { initialValue: '' });
  protected readonly sending = signal(false);
  protected readonly message = signal<{ kind: 'ok' | 'error' | 'conflict'; text: string } | null>(null);
  /** The saved answers from another browser, when a save met them. */
  protected readonly theirs = signal<{ version: number; nominations: Nomination[] } | null>(null);
  /** The explicit "I talk to nobody here regularly" answer; picking a name clears it. */
  protected readonly nobody = signal(false);
  private version = 0;
  private readonly tick = signal(0);

  protected readonly picked = computed(() => {
    this.tick();
    return Object.entries(this.form().controls).filter(([, c]) => c.value).length;
  });
  /** Neither a name nor "nobody": the server refuses an empty answer, so the page says so first. */
  protected readonly empty = computed(() => this.picked() === 0 && !this.nobody());
  protected readonly visibleNames = computed(() => {
    const q = this.filterText().trim().toLowerCase();
    return this.state().names.filter((n) => !q || n.name.toLowerCase().includes(q));
  });
  protected readonly nameOf = computed(() => new Map(this.state().names.map((n) => [n.id, n.name])));

  constructor() {
    effect(() => this.reset(this.state()));
  }

  private reset(s: SurveyState): void {
    const group = new FormGroup<Record<string, FormControl<Pick>>>({}, { validators: pickLimit(s.nominationLimit) });
    const mine = new Map(s.nominations.map((n) => [n.participantId, n.level]));
    for (const n of s.names) group.addControl(String(n.id), new FormControl<Pick>(mine.get(n.id) ?? '', { nonNullable: true }));
    if (!s.open) group.disable();
    group.valueChanges.subscribe(() => this.tick.update((v) => v + 1));
    this.version = s.version;
    this.nobody.set(s.nobody);
    this.form.set(group);
    this.tick.update((v) => v + 1);
  }

  protected control(id: number): FormControl<Pick> {
    const control = this.form().controls[String(id)];
    if (!control) throw new Error(`The survey has no answer for person ${id}.`);
    return control;
  }

  protected toggle(id: number): void {
    const c = this.control(id);
    if (c.disabled) return;
    c.setValue(c.value ? '' : 'weekly');
    if (c.value) this.nobody.set(false);
    this.message.set(null);
  }

  protected toggleNobody(): void {
    if (!this.state().open) return;
    const on = !this.nobody();
    this.nobody.set(on);
    if (on) for (const c of Object.values(this.form().controls)) c.setValue('');
    this.message.set(null);
  }

  protected setLevel(id: number, level: SurveyLevel): void {
    this.control(id).setValue(level);
  }

  private current(): Nomination[] {
    return Object.entries(this.form().controls)
      .filter(([, c]) => c.value)
      .map(([id, c]) => ({ participantId: Number(id), level: c.value as SurveyLevel }));
  }

  protected send(version = this.version): void {
    if (this.form().invalid) return;
    if (this.empty()) {
      this.message.set({ kind: 'error', text: EMPTY_MESSAGE });
      return;
    }
    this.sending.set(true);
    this.message.set(null);
    this.api
      .save(this.token(), version, this.current(), this.nobody())
      .pipe(finalize(() => this.sending.set(false)))
      .subscribe({
        next: (state) => {
          this.theirs.set(null);
          this.version = state.version;
          this.message.set({ kind: 'ok', text: 'Thank you, your answers are saved. You can change them until the survey closes.' });
          this.saved.emit(state);
        },
        error: (err: unknown) => this.refused(toApiError(err)),
      });
  }

  /** A stale save keeps the person's own picks and shows what was saved elsewhere. */
  private refused(e: ApiError): void {
    if (e.code === 'answers_changed') {
      const d = e.details as unknown as { version: number; nominations: Nomination[] };
      this.theirs.set({ version: d.version, nominations: d.nominations });
      this.message.set({ kind: 'conflict', text: e.message });
    } else {
      this.message.set({ kind: 'error', text: e.message });
    }
  }

  /** Keep the picks on this page, replacing the answers saved elsewhere. */
  protected keepMine(): void {
    const theirs = this.theirs();
    if (theirs) this.send(theirs.version);
  }

  /** Take the answers saved elsewhere into this page. */
  protected takeTheirs(): void {
    const theirs = this.theirs();
    if (!theirs) return;
    const mine = new Map(theirs.nominations.map((n) => [n.participantId, n.level]));
    for (const [id, c] of Object.entries(this.form().controls)) c.setValue(mine.get(Number(id)) ?? '');
    this.nobody.set(theirs.nominations.length === 0);
    this.version = theirs.version;
    this.theirs.set(null);
    this.message.set({
      kind: 'ok',
      text: 'These are the answers saved from your other browser. Change them and send, or leave them as they are.',
    });
  }
}
