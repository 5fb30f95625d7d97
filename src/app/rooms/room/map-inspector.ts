import { ChangeDetectionStrategy, Component, computed, effect, inject, untracked } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RoomEditor } from '../editor/room-editor';
import { groupProblem, personNameProblem, problemValidator, strengthProblem } from '../editor/validation';

/** Edits what is selected on the map: one person, several people, or one tie. */
@Component({
  selector: 'app-map-inspector',
  imports: [ReactiveFormsModule, MatAutocompleteModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  templateUrl: './map-inspector.html',
  styleUrl: './map-inspector.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MapInspector {
  protected readonly editor = inject(RoomEditor);
  private readonly snack = inject(MatSnackBar);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly person = this.fb.group({
    name: ['', problemValidator((v: string) => personNameProblem(v))],
    group: ['', problemValidator((v: string) => groupProblem(v))],
  });
  protected readonly many = this.fb.group({ group: ['', problemValidator((v: string) => groupProblem(v))] });
  protected readonly tie = this.fb.group({ strength: [1 as number | string, problemValidator((v: unknown) => strengthProblem(v))] });

  protected readonly state = computed(() => {
    this.editor.selectionRevision();
    this.editor.revision();
    const s = this.editor.selection;
    const m = this.editor.model;
    if (s.tie) {
      const t = m.ties.get(s.tie);
      if (!t) return { kind: 'none' as const };
      return { kind: 'tie' as const, tie: t, source: m.people.get(t.source)?.name ?? '?', target: m.people.get(t.target)?.name ?? '?' };
    }
    if (s.size === 1) {
      const p = m.people.get(s.ids()[0]);
      if (!p) return { kind: 'none' as const };
      return { kind: 'person' as const, person: p, ties: m.tiesOf(p.lid).length };
    }
    if (s.size > 1) return { kind: 'many' as const, count: s.size, pinned: s.ids().filter((l) => m.people.get(l)?.pinned).length };
    return { kind: 'none' as const };
  });

  constructor() {
    effect(() => {
      const st = this.state();
      untracked(() => {
        if (st.kind === 'person') this.person.setValue({ name: st.person.name, group: st.person.group ?? '' }, { emitEvent: false });
        if (st.kind === 'tie') this.tie.setValue({ strength: st.tie.strength }, { emitEvent: false });
      });
    });
  }

  protected savePerson(): void {
    const st = this.state();
    if (st.kind !== 'person' || this.person.invalid) return;
    const name = this.person.controls.name.value.trim();
    const group = this.person.controls.group.value.trim() || null;
    const changes: { name?: string; group?: string | null } = {};
    if (name !== st.person.name) changes.name = name;
    if (group !== st.person.group) changes.group = group;
    if (Object.keys(changes).length)
      this.editor.updatePerson(st.person.lid, changes, changes.name ? `Rename ${st.person.name}` : 'Change group');
  }

  protected saveGroupForMany(): void {
    if (this.many.invalid) return;
    const group = this.many.controls.group.value.trim() || null;
    const ids = this.editor.selection.ids();
    this.editor.execute(
      `Move ${ids.length} people to ${group ?? 'no group'}`,
      ids.map((lid) => ({ op: 'updatePerson' as const, lid, changes: { group } })),
    );
  }

  protected saveStrength(): void {
    const st = this.state();
    if (st.kind !== 'tie' || this.tie.invalid) return;
    this.editor.setTieStrength(st.tie.lid, Number(String(this.tie.controls.strength.value).replace(',', '.')));
  }

  protected setPinned(pinned: boolean): void {
    this.editor.setPinned(this.editor.selection.ids(), pinned);
  }

  deleteSelection(): void {
    const s = this.editor.selection;
    if (s.tie) {
      this.editor.deleteTies([s.tie]);
      this.offerUndo('Tie deleted.');
    } else if (s.size) {
      const n = s.size;
      this.editor.deletePeople(s.ids());
      this.offerUndo(n === 1 ? 'Person deleted with their ties.' : `${n} people deleted with their ties.`);
    }
  }

  private offerUndo(message: string): void {
    this.snack
      .open(message, 'Undo', { duration: 6000 })
      .onAction()
      .subscribe(() => this.editor.undo());
  }
}
