import { computed, inject, Injectable, type OnDestroy, signal } from '@angular/core';
import { concatMap, defer, type Observable, of, Subject, tap } from 'rxjs';
import type { RoomDto, RoomSettings, StaleVersionDetails, UpdateRoomRequest } from '../../../../shared/api/rooms';
import { type ApiError, toApiError } from '../../core/api-error';
import { RoomsApi } from '../rooms-api';
import { CommandStack } from './command-stack';
import { Outbox } from './outbox';
import { type EditorOp, type EditorPerson, type EditorTie, type Move, type PersonFields, RoomModel } from './room-model';
import { saveFailure } from './save-failure';
import { Selection } from './selection';

export type SaveState = 'saved' | 'unsaved' | 'saving' | 'failed' | 'conflict';
export type RoomMeta = Omit<RoomDto, 'people' | 'ties'>;

/**
 * A user's change is sent at once (the next turn of the event loop, so the ops of one gesture
 * go in one batch); positions found by the layout wait a little, since a layout run reports
 * many small moves.
 */
const SAVE_DELAY_MS = 0;
const LAYOUT_SAVE_DELAY_MS = 700;
/** Room name and settings are typed: wait for a pause. */
const ROOM_SAVE_DELAY_MS = 700;

/**
 * The room being edited on one page: the local model, undo and redo, the selection, and
 * autosave through the batch endpoint. Every change goes through `execute`, so the map and
 * the tables stay in step and every change can be undone.
 */
@Injectable()
export class RoomEditor implements OnDestroy {
  private readonly api = inject(RoomsApi);

  readonly model = new RoomModel();
  readonly stack = new CommandStack();
  readonly selection = new Selection();
  private readonly outbox = new Outbox();

  readonly room = signal<RoomMeta | null>(null);
  /** Bumps on every change of people or ties (including moves). */
  readonly revision = signal(0);
  readonly selectionRevision = signal(0);
  readonly saveState = signal<SaveState>('saved');
  readonly saveError = signal<string | null>(null);
  readonly conflict = signal<StaleVersionDetails | null>(null);
  /** The version last confirmed by the server for content changes (the summary follows it). */
  readonly savedVersion = signal(0);
  readonly loadError = signal<ApiError | null>(null);
  /** Bumps each time the room is (re)loaded from the server; forms follow it, not every edit. */
  readonly loaded = signal(0);

  readonly canEdit = computed(() => {
    const r = this.room();
    return !!r && r.access !== 'viewer';
  });
  readonly people = computed<EditorPerson[]>(() => {
    this.revision();
    return [...this.model.people.values()];
  });
  readonly ties = computed<EditorTie[]>(() => {
    this.revision();
    return [...this.model.ties.values()];
  });
  readonly groups = computed(() =>
    [...new Set(this.people().map((p) => p.group ?? ''))].filter((g) => g).sort((a, b) => a.localeCompare(b, undefined, { numeric: true })),
  );
  readonly history = computed(() => {
    this.revision();
    return { canUndo: this.stack.canUndo, canRedo: this.stack.canRedo, undo: this.stack.undoLabel, redo: this.stack.redoLabel };
  });

  private timer: ReturnType<typeof setTimeout> | null = null;
  private dueAt = 0;
  private inFlight = false;
  private pendingPatch: Omit<UpdateRoomRequest, 'version'> | null = null;
  private nextLocal = 1;

  ngOnDestroy(): void {
    if (this.timer) clearTimeout(this.timer);
    // Leaving the page: send what is left right away.
    if (this.outbox.pending || this.pendingPatch) this.flush();
  }

  get hasUnsaved(): boolean {
    return this.outbox.pending > 0 || !!this.pendingPatch || this.inFlight;
  }

  /** Loads the room (again), dropping what is not saved; a failure is kept in `loadError`. */
  load(id: number): void {
    this.loadError.set(null);
    this.api.room(id).subscribe({
      next: (dto) => this.reset(dto),
      error: (err: unknown) => this.loadError.set(toApiError(err)),
    });
  }

  private reset(dto: RoomDto): void {
    const { people, ties, ...meta } = dto;
    this.model.replaceWith(people, ties);
    this.outbox.restart(people, ties);
    this.stack.clear();
    this.selection.clear();
    this.pendingPatch = null;
    this.room.set(meta);
    this.savedVersion.set(meta.version);
    this.conflict.set(null);
    this.saveError.set(null);
    this.saveState.set('saved');
    this.changed();
    this.selectionChanged();
    this.loaded.update((v) => v + 1);
  }

  // ---- commands ----

  /** Applies a user action, records it for undo and queues it for saving. */
  execute(label: string, ops: EditorOp[]): void {
    if (!this.canEdit() || !ops.length) return;
    const undo = this.model.applyAll(ops);
    this.stack.push({ label, redo: ops, undo });
    this.queue(ops);
  }

  undo(): void {
    if (!this.canEdit()) return;
    const cmd = this.stack.undo();
    if (!cmd) return;
    this.model.applyAll(cmd.undo);
    this.queue(cmd.undo);
  }

  redo(): void {
    if (!this.canEdit()) return;
    const cmd = this.stack.redo();
    if (!cmd) return;
    this.model.applyAll(cmd.redo);
    this.queue(cmd.redo);
  }

  /** Positions found by the layout (not a user action: saved, but not on the undo stack). */
  recordLayout(moves: Move[]): void {
    if (!this.canEdit() || !moves.length) return;
    const op: EditorOp = { op: 'move', moves };
    this.model.apply(op);
    this.queue([op], LAYOUT_SAVE_DELAY_MS);
  }

  newPersonLid(): string {
    return `n${this.nextLocal++}`;
  }

  newTieLid(): string {
    return `m${this.nextLocal++}`;
  }

  /** A key not used in the room yet: P1, P2, ... */
  freeKey(): string {
    const taken = new Set([...this.model.people.values()].map((p) => p.key));
    let i = this.model.people.size + 1;
    while (taken.has(`P${i}`)) i++;
    return `P${i}`;
  }

  keyTaken(key: string, except?: string): boolean {
    for (const p of this.model.people.values()) if (p.key === key && p.lid !== except) return true;
    return false;
  }

  addPerson(fields: Partial<PersonFields> & { name: string }): string {
    const lid = this.newPersonLid();
    const full: PersonFields = { key: fields.key || this.freeKey(), group: null, email: null, x: null, y: null, pinned: false, ...fields };
    this.execute(`Add ${full.name}`, [{ op: 'addPerson', lid, fields: full }]);
    return lid;
  }

  updatePerson(lid: string, changes: Partial<PersonFields>, label = 'Edit person'): void {
    this.execute(label, [{ op: 'updatePerson', lid, changes }]);
  }

  deletePeople(lids: string[]): void {
    const ops: EditorOp[] = [];
    const seenTies = new Set<string>();
    for (const lid of lids) {
      for (const t of this.model.tiesOf(lid)) {
        if (!seenTies.has(t.lid)) ops.push({ op: 'deleteTie', lid: t.lid });
        seenTies.add(t.lid);
      }
    }
    for (const lid of lids) ops.push({ op: 'deletePerson', lid });
    const only = lids.length === 1 ? lids[0] : undefined;
    const label = only !== undefined ? `Delete ${this.model.people.get(only)?.name ?? 'person'}` : `Delete ${lids.length} people`;
    this.execute(label, ops);
    this.dropGoneFromSelection();
  }

  /** Adds a tie, or returns the one already there between the two people. */
  addTie(source: string, target: string, strength = 1): { lid: string; existed: boolean } {
    const existing = this.model.findTie(source, target, !!this.room()?.settings.directed);
    if (existing) return { lid: existing.lid, existed: true };
    const lid = this.newTieLid();
    const a = this.model.people.get(source)?.name;
    const b = this.model.people.get(target)?.name;
    this.execute(`Tie ${a} and ${b}`, [{ op: 'addTie', lid, source, target, strength }]);
    return { lid, existed: false };
  }

  setTieStrength(lid: string, strength: number): void {
    if (this.model.ties.get(lid)?.strength === strength) return;
    this.execute('Change strength', [{ op: 'updateTie', lid, strength }]);
  }

  deleteTies(lids: string[]): void {
    this.execute(
      lids.length === 1 ? 'Delete tie' : `Delete ${lids.length} ties`,
      lids.map((lid) => ({ op: 'deleteTie', lid })),
    );
    this.dropGoneFromSelection();
  }

  movePeople(moves: Move[], label = moves.length === 1 ? 'Move person' : `Move ${moves.length} people`): void {
    this.execute(label, [{ op: 'move', moves }]);
  }

  setPinned(lids: string[], pinned: boolean): void {
    const moves = lids
      .map((lid) => this.model.person(lid))
      .filter((p) => p.x !== null && p.y !== null)
      .map((p) => ({ lid: p.lid, x: p.x!, y: p.y!, pinned }));
    this.movePeople(moves, pinned ? 'Pin' : 'Unpin');
  }

  /** Name, description or settings: saved through PATCH with the room's version. */
  updateRoom(changes: { name?: string; description?: string; settings?: Partial<RoomSettings> }): void {
    const r = this.room();
    if (!r || !this.canEdit()) return;
    this.room.set({
      ...r,
      ...(changes.name !== undefined ? { name: changes.name } : {}),
      settings: { ...r.settings, ...changes.settings },
    });
    this.pendingPatch = {
      ...this.pendingPatch,
      ...changes,
      settings: { ...this.pendingPatch?.settings, ...changes.settings },
    };
    this.saveState.set('unsaved');
    this.scheduleSave(ROOM_SAVE_DELAY_MS);
  }

  /** After a delete: the selection keeps only what is still in the room. */
  private dropGoneFromSelection(): void {
    this.selection.keepOnly(
      (l) => this.model.people.has(l),
      (l) => this.model.ties.has(l),
    );
    this.selectionChanged();
  }

  selectionChanged(): void {
    this.selectionRevision.update((v) => v + 1);
  }

  // ---- saving ----

  private queue(ops: EditorOp[], delay = SAVE_DELAY_MS): void {
    this.outbox.push(ops);
    this.changed();
    if (this.saveState() !== 'conflict') this.saveState.set('unsaved');
    this.scheduleSave(delay);
  }

  private changed(): void {
    this.revision.update((v) => v + 1);
  }

  /** Sets the save timer; a save already due sooner keeps its time. */
  private scheduleSave(delay: number): void {
    if (this.saveState() === 'conflict') return;
    const due = Date.now() + delay;
    if (this.timer && this.dueAt <= due) return;
    if (this.timer) clearTimeout(this.timer);
    this.dueAt = due;
    this.timer = setTimeout(() => {
      this.timer = null;
      this.flush();
    }, delay);
  }

  /**
   * Sends everything queued, one request at a time. Safe to call at any moment: it starts at once
   * (nothing to subscribe), and the answer completes when this round of sending has ended, saved
   * or not; while a round is in flight it completes at once and that round sends the rest.
   */
  flush(): Observable<void> {
    const room = this.room();
    if (this.inFlight || this.saveState() === 'conflict' || !room) return of(undefined);
    this.inFlight = true;
    // This save sends what a pending timer would have sent: the timer is not needed any more.
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.saveState.set('saving');
    this.saveError.set(null);
    const ended = new Subject<void>();
    this.sendQueued(room.id).subscribe({
      complete: () => {
        this.saveState.set('saved');
        this.inFlight = false;
        // Changes made while the last request was in flight.
        if (this.outbox.pending || this.pendingPatch) this.scheduleSave(0);
        ended.complete();
      },
      error: (err: unknown) => {
        this.saveFailed(toApiError(err), room);
        this.inFlight = false;
        ended.complete();
      },
    });
    return ended.asObservable();
  }

  /** The pending room patch first, then the outbox batch by batch, until nothing is left. */
  private sendQueued(roomId: number): Observable<unknown> {
    return defer(() => {
      const version = this.room()?.version ?? 0;
      if (this.pendingPatch) {
        const body: UpdateRoomRequest = { version, ...this.pendingPatch };
        if (!body.settings || !Object.keys(body.settings).length) delete body.settings;
        return this.api.update(roomId, body).pipe(
          tap((dto) => {
            this.pendingPatch = null;
            this.setVersion(dto.version, true);
          }),
          concatMap(() => this.sendQueued(roomId)),
        );
      }
      if (!this.outbox.pending) return of(null);
      const batch = this.outbox.next();
      if (!batch) {
        this.outbox.discard();
        return of(null);
      }
      const body = batch.layoutOnly ? { ops: batch.ops } : { version, ops: batch.ops };
      const sent = batch.ops.length ? this.api.edit(roomId, body) : of({ version, layoutOnly: true, people: {}, ties: {} });
      return sent.pipe(
        tap((result) => {
          this.outbox.acknowledge(batch.count, result);
          if (!result.layoutOnly) this.setVersion(result.version, true);
        }),
        concatMap(() => this.sendQueued(roomId)),
      );
    });
  }

  /** A stale version asks the user; a busy server gets the change again later; anything else is shown. */
  private saveFailed(e: ApiError, room: RoomMeta): void {
    const failure = saveFailure(e, room.version);
    if (failure.kind === 'conflict') {
      this.conflict.set(failure.conflict);
      this.saveState.set('conflict');
    } else if (failure.kind === 'busy') {
      // Everything stays queued and is sent again by itself shortly.
      this.saveError.set(failure.message);
      this.saveState.set('unsaved');
      this.scheduleSave(failure.waitMs);
    } else {
      this.saveError.set(failure.message);
      this.saveState.set('failed');
    }
  }

  private setVersion(version: number, content: boolean): void {
    const r = this.room();
    if (r) this.room.set({ ...r, version });
    if (content) this.savedVersion.set(version);
  }

  retry(): void {
    this.flush();
  }

  /** "Keep yours": apply the unsaved changes on top of the newer version. */
  keepMine(): void {
    const c = this.conflict();
    if (!c) return;
    this.setVersion(c.currentVersion, false);
    this.conflict.set(null);
    this.saveState.set('unsaved');
    this.flush();
  }

  /** "Reload" (and after an import replaced the room): drop the unsaved changes and show the room as it is now. */
  reloadFromServer(): void {
    const r = this.room();
    if (!r) return;
    this.conflict.set(null);
    this.load(r.id);
  }
}
