import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, untracked } from '@angular/core';
import { FormsModule, NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RoomEditor } from '../editor/room-editor';
import type { EditorPerson } from '../editor/room-model';
import { groupProblem, personNameProblem, problemValidator, strengthProblem } from '../editor/validation';

/** Edits what is selected on the map: one person, several people, or one tie. */
@Component({
  selector: 'app-map-inspector',
  imports: [FormsModule, ReactiveFormsModule, MatAutocompleteModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
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
      const [id] = s.ids();
      const p = id === undefined ? undefined : m.people.get(id);
      if (!p) return { kind: 'none' as const };
      return { kind: 'person' as const, person: p, ties: m.tiesOf(p.lid).length };
    }
    if (s.size > 1) return { kind: 'many' as const, count: s.size, pinned: s.ids().filter((l) => m.people.get(l)?.pinned).length };
    return { kind: 'none' as const };
  });

  /** "Tie to": the keyboard (and menu) way to draw a tie from the selected person. */
  protected readonly tieQuery = signal('');
  protected readonly tieCandidates = computed(() => {
    const st = this.state();
    if (st.kind !== 'person') return [];
    const q = this.tieQuery().trim().toLowerCase();
    const tied = this.tiedTo(st.person.lid);
    const out: EditorPerson[] = [];
    // One pass that stops at 30: a room of 100,000 people answers a keystroke at once.
    for (const p of this.editor.people()) {
      if (p.lid === st.person.lid || tied.has(p.lid)) continue;
      if (q && !p.name.toLowerCase().includes(q) && !(p.group ?? '').toLowerCase().includes(q)) continue;
      out.push(p);
      if (out.length === 30) break;
    }
    return out;
  });

  /** Everyone a new tie from `lid` would duplicate (either way round in an undirected room). */
  private tiedTo(lid: string): Set<string> {
    const directed = !!this.editor.room()?.settings.directed;
    const tied = new Set<string>();
    for (const t of this.editor.model.tiesOf(lid)) {
      if (t.source === lid) tied.add(t.target);
      else if (!directed) tied.add(t.source);
    }
    return tied;
  }

  /**
   * The person and the tie the forms were filled for. A save always goes to these, never to
   * whatever is selected by the time the save runs: clicking another person selects them on
   * mousedown, before the field's blur saves what was typed.
   */
  private personLid: string | null = null;
  private tieLid: string | null = null;

  constructor() {
    effect(() => {
      const st = this.state();
      untracked(() => this.follow(st));
    });
  }

  /** The selection moved: settle the edit typed for the previous person or tie, then show the new one. */
  private follow(st: ReturnType<MapInspector['state']>): void {
    const lid = st.kind === 'person' ? st.person.lid : null;
    if (this.personLid && this.personLid !== lid && this.person.dirty) this.savePerson(true);
    const tieLid = st.kind === 'tie' ? st.tie.lid : null;
    if (this.tieLid && this.tieLid !== tieLid && this.tie.dirty) this.saveStrength(true);
    this.personLid = lid;
    this.tieLid = tieLid;
    // Keep what is being typed for the same person (a save elsewhere bumps the revision too).
    if (st.kind === 'person' && !this.person.dirty) {
      this.person.reset({ name: st.person.name, group: st.person.group ?? '' }, { emitEvent: false });
    }
    if (st.kind === 'tie' && !this.tie.dirty) this.tie.reset({ strength: st.tie.strength }, { emitEvent: false });
  }

  /** Commits the typed name and group to the person they were typed for; `leaving`: the selection moved on. */
  protected savePerson(leaving = false): void {
    const lid = this.personLid;
    const p = lid ? this.editor.model.people.get(lid) : undefined;
    if (!p || !this.person.dirty) return;
    if (this.person.invalid) {
      // Still on this person: the field shows what to fix. Moving on: say what was dropped.
      if (!leaving) return;
      const problem = this.person.controls.name.errors?.['problem'] ?? this.person.controls.group.errors?.['problem'];
      this.person.reset({ name: p.name, group: p.group ?? '' }, { emitEvent: false });
      this.snack.open(`Your change to ${p.name} was not kept: ${problem}`, 'OK', { duration: 6000 });
      return;
    }
    const name = this.person.controls.name.value.trim();
    const group = this.person.controls.group.value.trim() || null;
    this.person.markAsPristine();
    const changes: { name?: string; group?: string | null } = {};
    if (name !== p.name) changes.name = name;
    if (group !== p.group) changes.group = group;
    if (Object.keys(changes).length) this.editor.updatePerson(p.lid, changes, changes.name ? `Rename ${p.name}` : 'Change group');
  }

  protected tieTo(target: string): void {
    const from = this.personLid;
    if (!from) return;
    this.editor.addTie(from, target);
    this.tieQuery.set('');
    const a = this.editor.model.people.get(from)?.name;
    const b = this.editor.model.people.get(target)?.name;
    this.snack
      .open(`Tie added: ${a} and ${b}.`, 'Undo', { duration: 5000 })
      .onAction()
      .subscribe(() => this.editor.undo());
  }

  protected readonly noName = (): string => '';

  protected saveGroupForMany(): void {
    if (this.many.invalid) return;
    const group = this.many.controls.group.value.trim() || null;
    const ids = this.editor.selection.ids();
    this.editor.execute(
      `Move ${ids.length} people to ${group ?? 'no group'}`,
      ids.map((lid) => ({ op: 'updatePerson' as const, lid, changes: { group } })),
    );
  }

  protected saveStrength(leaving = false): void {
    const t = this.tieLid ? this.editor.model.ties.get(this.tieLid) : undefined;
    if (!t || !this.tie.dirty) return;
    if (this.tie.invalid) {
      if (!leaving) return;
      const problem = this.tie.controls.strength.errors?.['problem'];
      this.tie.reset({ strength: t.strength }, { emitEvent: false });
      this.snack.open(`Your strength for that tie was not kept: ${problem}`, 'OK', { duration: 6000 });
      return;
    }
    this.tie.markAsPristine();
    this.editor.setTieStrength(t.lid, Number(String(this.tie.controls.strength.value).replace(',', '.')));
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
