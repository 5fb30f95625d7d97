import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatAutocompleteModule, type MatAutocompleteSelectedEvent } from '@angular/material/autocomplete';
import { MatChipsModule } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { PersonDto } from '../../../shared/api/rooms';

/** Searchable chips of the room's people, bound to a FormControl of person ids (order kept). */
@Component({
  selector: 'app-person-chips',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatChipsModule, MatAutocompleteModule, MatIconModule, MatInputModule],
  template: `
    <mat-form-field appearance="outline" class="field" [class.has-problem]="!!error()">
      <mat-label>{{ label() }}</mat-label>
      <mat-chip-grid #grid [attr.aria-label]="label()">
        @for (id of selected(); track id; let i = $index) {
          <mat-chip-row (removed)="remove(id)">
            @if (numbered()) {
              <span class="n">{{ i + 1 }}</span>
            }
            {{ nameOf(id) }}
            <button matChipRemove [attr.aria-label]="'Remove ' + nameOf(id)"><mat-icon>cancel</mat-icon></button>
          </mat-chip-row>
        }
        <input
          [placeholder]="placeholder()"
          [formControl]="search"
          [matChipInputFor]="grid"
          [matAutocomplete]="auto"
          [attr.aria-label]="label() + ': search people'"
        />
      </mat-chip-grid>
      <mat-autocomplete #auto="matAutocomplete" (optionSelected)="add($event)">
        @for (p of options(); track p.id) {
          <mat-option [value]="p.id"
            >{{ p.name }}
            @if (p.group) {
              <span class="rh-muted"> · {{ p.group }}</span>
            }
          </mat-option>
        }
      </mat-autocomplete>
      @if (error()) {
        <mat-hint class="problem" role="alert">{{ error() }}</mat-hint>
      } @else if (hint()) {
        <mat-hint>{{ hint() }}</mat-hint>
      }
    </mat-form-field>
  `,
  styles: `
    .field {
      width: 100%;
    }
    .n {
      font-weight: 700;
      color: var(--rh-clay-text);
      margin-right: 4px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PersonChips {
  readonly people = input.required<readonly PersonDto[]>();
  readonly control = input.required<FormControl<number[]>>();
  readonly label = input.required<string>();
  readonly placeholder = input('Type a name…');
  readonly hint = input<string>('');
  readonly error = input<string | null | undefined>(null);
  /** Show the position of each chip (briefing order of a hand-made plan). */
  readonly numbered = input(false);

  protected readonly search = new FormControl<string | number>('', { nonNullable: true });
  private readonly term = toSignal(this.search.valueChanges, { initialValue: '' });
  private readonly version = signal(0);

  protected readonly selected = computed(() => {
    this.version();
    return this.control().value;
  });
  private readonly byId = computed(() => new Map(this.people().map((p) => [p.id, p])));

  protected readonly options = computed(() => {
    const t = this.term();
    const q = typeof t === 'string' ? t.trim().toLowerCase() : '';
    const chosen = new Set(this.selected());
    return this.people()
      .filter((p) => !chosen.has(p.id) && (!q || p.name.toLowerCase().includes(q) || (p.group ?? '').toLowerCase().includes(q)))
      .slice(0, 50);
  });

  protected nameOf(id: number): string {
    return this.byId().get(id)?.name ?? `#${id}`;
  }

  protected add(e: MatAutocompleteSelectedEvent): void {
    const id = e.option.value as number;
    const c = this.control();
    if (!c.value.includes(id)) c.setValue([...c.value, id]);
    c.markAsTouched();
    this.search.setValue('');
    this.version.update((v) => v + 1);
  }

  protected remove(id: number): void {
    const c = this.control();
    c.setValue(c.value.filter((x) => x !== id));
    c.markAsTouched();
    this.version.update((v) => v + 1);
  }
}
