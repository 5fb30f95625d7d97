import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, viewChild } from '@angular/core';
import { type AbstractControl, NonNullableFormBuilder, ReactiveFormsModule, type ValidationErrors } from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RoomEditor } from '../editor/room-editor';
import { problemValidator, strengthProblem } from '../editor/validation';

interface TieRow {
  lid: string;
  source: string;
  target: string;
  sourceName: string;
  targetName: string;
  strength: number;
}

/** Ties as a table: add a tie by picking two people, change its strength, delete it. */
@Component({
  selector: 'app-ties-table',
  imports: [
    ReactiveFormsModule,
    MatAutocompleteModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatSortModule,
    MatTableModule,
    MatTooltipModule,
  ],
  templateUrl: './ties-table.html',
  styleUrl: './room-tables.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TiesTable {
  protected readonly editor = inject(RoomEditor);
  private readonly snack = inject(MatSnackBar);
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);

  protected readonly data = new MatTableDataSource<TieRow>([]);
  protected readonly editing = signal<string | null>(null);
  protected readonly columns = ['sourceName', 'targetName', 'strength', 'actions'];
  protected readonly directed = computed(() => !!this.editor.room()?.settings.directed);

  private readonly personExists = (c: AbstractControl): ValidationErrors | null => {
    const v = String(c.value ?? '').trim();
    if (!v) return { problem: 'Pick a person.' };
    return this.lidByName(v) ? null : { problem: 'Nobody of that name or key in this room.' };
  };
  protected readonly addForm = this.fb.group({
    source: ['', this.personExists],
    target: ['', this.personExists],
    strength: [1 as number | string, problemValidator((v: unknown) => strengthProblem(v))],
  });
  protected readonly strength = this.fb.control<number | string>(
    1,
    problemValidator((v: unknown) => strengthProblem(v)),
  );
  protected readonly sourceQuery = signal('');
  protected readonly targetQuery = signal('');
  protected readonly sourceOptions = computed(() => this.options(this.sourceQuery()));
  protected readonly targetOptions = computed(() => this.options(this.targetQuery()));

  constructor() {
    this.data.filterPredicate = (t, f) => `${t.sourceName} ${t.targetName}`.toLowerCase().includes(f);
    this.data.sortingDataAccessor = (t, col) =>
      col === 'strength' ? t.strength : String((t as unknown as Record<string, unknown>)[col]).toLowerCase();
    effect(() => {
      const people = this.editor.model.people;
      this.data.data = this.editor.ties().map((t) => ({
        lid: t.lid,
        source: t.source,
        target: t.target,
        sourceName: people.get(t.source)?.name ?? '?',
        targetName: people.get(t.target)?.name ?? '?',
        strength: t.strength,
      }));
    });
    effect(() => {
      this.data.sort = this.sort();
      this.data.paginator = this.paginator();
    });
    this.addForm.controls.source.valueChanges.subscribe((v) => this.sourceQuery.set(v));
    this.addForm.controls.target.valueChanges.subscribe((v) => this.targetQuery.set(v));
  }

  private options(q: string) {
    const s = q.trim().toLowerCase();
    return this.editor
      .people()
      .filter((p) => !s || p.name.toLowerCase().includes(s) || p.key.toLowerCase() === s)
      .slice(0, 20);
  }

  /** A typed name or key to the person; a name shared by two people needs the key. */
  private lidByName(v: string): string | null {
    const people = this.editor.people();
    const byKey = people.find((p) => p.key === v);
    if (byKey) return byKey.lid;
    const named = people.filter((p) => p.name === v);
    const [only, ...others] = named;
    return only && others.length === 0 ? only.lid : null;
  }

  protected filter(value: string): void {
    this.data.filter = value.trim().toLowerCase();
    this.data.paginator?.firstPage();
  }

  protected add(): void {
    if (this.addForm.invalid) {
      this.addForm.markAllAsTouched();
      return;
    }
    const v = this.addForm.getRawValue();
    const source = this.lidByName(v.source.trim())!;
    const target = this.lidByName(v.target.trim())!;
    if (source === target) {
      this.addForm.controls.target.setErrors({ problem: 'A tie joins two different people.' });
      return;
    }
    const res = this.editor.addTie(source, target, Number(String(v.strength).replace(',', '.')));
    if (res.existed) {
      this.addForm.controls.target.setErrors({ problem: 'These two already have a tie: change its strength in the table.' });
      return;
    }
    this.addForm.reset({ source: '', target: '', strength: 1 });
    this.snack
      .open('Tie added.', 'Undo', { duration: 5000 })
      .onAction()
      .subscribe(() => this.editor.undo());
  }

  protected startEdit(t: TieRow): void {
    this.editing.set(t.lid);
    this.strength.setValue(t.strength);
  }

  protected saveEdit(t: TieRow): void {
    if (this.strength.invalid) {
      this.strength.markAsTouched();
      return;
    }
    this.editor.setTieStrength(t.lid, Number(String(this.strength.value).replace(',', '.')));
    this.editing.set(null);
  }

  protected editKeys(e: KeyboardEvent, t: TieRow): void {
    if (e.key === 'Enter') {
      e.preventDefault();
      this.saveEdit(t);
    } else if (e.key === 'Escape') {
      e.stopPropagation();
      this.editing.set(null);
    }
  }

  protected remove(t: TieRow): void {
    this.editor.deleteTies([t.lid]);
    this.snack
      .open(`Tie ${t.sourceName} – ${t.targetName} deleted.`, 'Undo', { duration: 6000 })
      .onAction()
      .subscribe(() => this.editor.undo());
  }
}
