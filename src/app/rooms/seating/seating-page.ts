import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { concatMap, defer, finalize, from } from 'rxjs';
import { ROOM_LIMITS } from '../../../../shared/api/rooms';
import {
  buildSeating,
  DEFAULT_SEATING,
  namesFromList,
  namesFromRosterCsv,
  type RosterEntry,
  type SeatingKind,
  type SeatingOptions,
  type SeatingResult,
  seatingProblems,
} from '../../../../shared/seating/seating';
import { toApiError } from '../../core/api-error';
import { RoomsApi } from '../rooms-api';
import { SeatingPreview } from './seating-preview';
import { itemAt } from '../../../../shared/checked';

/** Builds a room from a seating layout: choose the layout and names, look at the preview, save. */
@Component({
  selector: 'app-seating-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    SeatingPreview,
  ],
  templateUrl: './seating-page.html',
  styleUrl: './seating-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class SeatingPage {
  private readonly api = inject(RoomsApi);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly form = this.fb.group({
    name: ['', [Validators.required, Validators.maxLength(ROOM_LIMITS.roomNameMax)]],
    kind: ['round' as SeatingKind],
    seatsPer: [DEFAULT_SEATING.seatsPer, [Validators.required, Validators.min(2), Validators.max(60)]],
    neighbourStrength: [DEFAULT_SEATING.neighbourStrength, [Validators.required, Validators.min(0.001), Validators.max(1000)]],
    acrossStrength: [DEFAULT_SEATING.acrossStrength, [Validators.required, Validators.min(0), Validators.max(1000)]],
    minglers: [DEFAULT_SEATING.minglers, [Validators.required, Validators.min(0), Validators.max(60)]],
    mingleStrength: [DEFAULT_SEATING.mingleStrength, [Validators.required, Validators.min(0.001), Validators.max(1000)]],
    names: [''],
  });
  protected readonly roster = signal<{ file: string; entries: RosterEntry[]; errors: string[] } | null>(null);
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);
  private readonly value = toSignal(this.form.valueChanges, { initialValue: this.form.getRawValue() });

  protected readonly entries = computed<RosterEntry[]>(() => this.roster()?.entries ?? namesFromList(this.value().names ?? ''));
  protected readonly options = computed<SeatingOptions>(() => {
    const v = { ...this.form.getRawValue(), ...this.value() };
    return {
      kind: v.kind,
      seatsPer: Number(v.seatsPer),
      neighbourStrength: Number(v.neighbourStrength),
      acrossStrength: Number(v.acrossStrength),
      minglers: v.kind === 'round' ? Number(v.minglers) : 0,
      mingleStrength: Number(v.mingleStrength),
    };
  });
  protected readonly problems = computed(() => seatingProblems(this.options(), this.entries().length));
  protected readonly result = computed(() => (this.problems().length ? null : buildSeating(this.entries(), this.options())));
  protected readonly kind = computed(() => this.value().kind ?? 'round');

  protected countsLine(r: SeatingResult): string {
    const unit = this.kind() === 'round' ? 'tables' : this.kind() === 'rows' ? 'rows' : 'U';
    const kinds = [`${r.counts.neighbour} neighbour`, `${r.counts.across} weaker`];
    if (r.counts.mingle) kinds.push(`${r.counts.mingle} mingling`);
    return `${r.people.length} people · ${r.groups} ${unit} · ${r.ties.length} ties (${kinds.join(', ')})`;
  }

  protected fillNumbered(count: string): void {
    const n = Math.min(Math.max(Number(count) || 0, 0), 3000);
    this.roster.set(null);
    this.form.controls.names.setValue(Array.from({ length: n }, (_, i) => `Seat ${i + 1}`).join('\n'));
  }

  protected async readRoster(e: Event): Promise<void> {
    const input = e.target as HTMLInputElement;
    const file = input.files?.[0];
    if (!file) return;
    if (file.size > ROOM_LIMITS.maxUploadBytes) {
      this.roster.set({ file: file.name, entries: [], errors: ['The file is larger than 8 MB; a roster of names is much smaller.'] });
      return;
    }
    const text = await file.text();
    const parsed = namesFromRosterCsv(text);
    this.roster.set({ file: file.name, ...parsed });
    input.value = '';
  }

  protected clearRoster(): void {
    this.roster.set(null);
  }

  protected save(): void {
    const r = this.result();
    if (this.form.invalid || !r || !this.form.controls.name.value.trim()) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.error.set(null);
    // Deferred: a seat the plan cannot name ends in the error message like a refusal.
    defer(() =>
      this.api.create({
        name: this.form.controls.name.value.trim(),
        description: describe(this.options(), r.groups),
        people: r.people.map((p) => ({ key: p.key, name: p.name, group: p.group, email: p.email, x: p.x, y: p.y })),
        ties: r.ties.map((t) => ({
          source: itemAt(r.people, t.source, 'seated person').key,
          target: itemAt(r.people, t.target, 'seated person').key,
          strength: t.strength,
        })),
      }),
    )
      .pipe(
        concatMap((room) => from(this.router.navigate(['/rooms', room.id]))),
        finalize(() => this.saving.set(false)),
      )
      .subscribe({
        error: (err: unknown) => {
          const e = toApiError(err);
          const fields = e.details?.fields
            ?.slice(0, 5)
            .map((f) => `${f.field}: ${f.message}`)
            .join('; ');
          this.error.set(fields ? `${e.message} (${fields})` : e.message);
        },
      });
  }
}

function describe(o: SeatingOptions, groups: number): string {
  if (o.kind === 'round')
    return `Seating plan: ${groups} round tables of up to ${o.seatsPer}${o.minglers ? `, ${o.minglers} minglers per table` : ''}.`;
  if (o.kind === 'rows') return `Seating plan: ${groups} classroom rows of up to ${o.seatsPer}.`;
  return 'Seating plan: one U-shape.';
}
