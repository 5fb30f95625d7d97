import { ChangeDetectionStrategy, Component, effect, inject, signal, viewChild } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
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
import type { EditorPerson } from '../editor/room-model';
import { emailProblem, groupProblem, keyProblem, personNameProblem, problemValidator } from '../editor/validation';

interface PersonRow extends EditorPerson {
  ties: number;
}

/** People as a table: the keyboard way to add, rename, regroup and delete. */
@Component({
  selector: 'app-people-table',
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
  templateUrl: './people-table.html',
  styleUrl: './room-tables.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PeopleTable {
  protected readonly editor = inject(RoomEditor);
  private readonly snack = inject(MatSnackBar);
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);

  protected readonly data = new MatTableDataSource<PersonRow>([]);
  protected readonly editing = signal<string | null>(null);
  protected readonly columns = ['key', 'name', 'group', 'email', 'ties', 'actions'];

  protected readonly addForm = this.fb.group({
    name: ['', problemValidator((v: string) => personNameProblem(v))],
    group: ['', problemValidator((v: string) => groupProblem(v))],
    email: ['', problemValidator((v: string) => emailProblem(v))],
  });
  protected readonly editForm = this.fb.group({
    key: ['', problemValidator((v: string) => keyProblem(v, (k) => this.editor.keyTaken(k, this.editing() ?? undefined)))],
    name: ['', problemValidator((v: string) => personNameProblem(v))],
    group: ['', problemValidator((v: string) => groupProblem(v))],
    email: ['', problemValidator((v: string) => emailProblem(v))],
  });

  constructor() {
    this.data.filterPredicate = (p, f) => `${p.key} ${p.name} ${p.group ?? ''} ${p.email ?? ''}`.toLowerCase().includes(f);
    this.data.sortingDataAccessor = (p, col) => {
      const v = (p as unknown as Record<string, unknown>)[col];
      return typeof v === 'number' ? v : String(v ?? '').toLowerCase();
    };
    effect(() => {
      const ties = new Map<string, number>();
      for (const t of this.editor.ties()) {
        ties.set(t.source, (ties.get(t.source) ?? 0) + 1);
        ties.set(t.target, (ties.get(t.target) ?? 0) + 1);
      }
      this.data.data = this.editor.people().map((p) => ({ ...p, ties: ties.get(p.lid) ?? 0 }));
    });
    effect(() => {
      this.data.sort = this.sort();
      this.data.paginator = this.paginator();
    });
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
    this.editor.addPerson({ name: v.name.trim(), group: v.group.trim() || null, email: v.email.trim() || null });
    this.addForm.reset();
    this.snack
      .open(`${v.name.trim()} added.`, 'Undo', { duration: 5000 })
      .onAction()
      .subscribe(() => this.editor.undo());
  }

  protected startEdit(p: PersonRow): void {
    this.editing.set(p.lid);
    this.editForm.setValue({ key: p.key, name: p.name, group: p.group ?? '', email: p.email ?? '' });
  }

  protected saveEdit(p: PersonRow): void {
    this.editForm.controls.key.updateValueAndValidity();
    if (this.editForm.invalid) {
      this.editForm.markAllAsTouched();
      return;
    }
    const v = this.editForm.getRawValue();
    const next = { key: v.key.trim(), name: v.name.trim(), group: v.group.trim() || null, email: v.email.trim() || null };
    const changes = Object.fromEntries(Object.entries(next).filter(([k, val]) => p[k as keyof typeof next] !== val));
    if (Object.keys(changes).length) this.editor.updatePerson(p.lid, changes, `Edit ${p.name}`);
    this.editing.set(null);
  }

  protected cancelEdit(): void {
    this.editing.set(null);
  }

  protected editKeys(e: KeyboardEvent, p: PersonRow): void {
    if (e.key === 'Enter') {
      e.preventDefault();
      this.saveEdit(p);
    } else if (e.key === 'Escape') {
      e.stopPropagation();
      this.cancelEdit();
    }
  }

  protected remove(p: PersonRow): void {
    this.editor.deletePeople([p.lid]);
    const ties = p.ties ? ` and ${p.ties} ${p.ties === 1 ? 'tie' : 'ties'}` : '';
    this.snack
      .open(`${p.name}${ties} deleted.`, 'Undo', { duration: 6000 })
      .onAction()
      .subscribe(() => this.editor.undo());
  }
}
