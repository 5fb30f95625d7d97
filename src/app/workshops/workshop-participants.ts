import { ChangeDetectionStrategy, Component, inject, input, linkedSignal, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { catchError, concatMap, from, type Observable, of, tap } from 'rxjs';
import type { WorkshopDetail } from '../../../shared/api/workshops';
import { toApiError } from '../core/api-error';
import { type ConfirmData, whenConfirmed } from '../core/confirm-dialog';
import { DateTimePipe } from '../core/date-format';
import { LinkSheetStore } from './link-sheet-store';
import { WorkshopStore } from './workshop-store';

type RosterIssue = { line: number; message: string };

/** The workshop page's participants panel: adding people, their links, and the confirmed changes to both. */
@Component({
  selector: 'app-workshop-participants',
  imports: [DateTimePipe, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './workshop-participants.html',
  styleUrl: './workshops.scss',
  // The panel's section is itself one cell of the page's grid.
  styles: ':host { display: contents; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WorkshopParticipants {
  readonly workshop = input.required<WorkshopDetail>();
  private readonly store = inject(WorkshopStore);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly sheet = inject(LinkSheetStore);
  private readonly dialog = inject(MatDialog);
  protected readonly rosterIssues = signal<RosterIssue[]>([]);
  protected readonly personForm = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(120)] }),
    email: new FormControl('', { nonNullable: true, validators: [Validators.email] }),
  });
  /** Participants ticked for a reissue of their links (someone who leaves the workshop leaves the choice too). */
  protected readonly chosen = linkedSignal<WorkshopDetail, ReadonlySet<number>>({
    source: this.workshop,
    computation: (w, previous) => {
      const ids = new Set(w.participants.map((p) => p.id));
      return new Set([...(previous?.value ?? [])].filter((id) => ids.has(id)));
    },
  });

  protected addPerson(): void {
    if (this.personForm.invalid) return;
    const { name, email } = this.personForm.getRawValue();
    this.store.run(
      this.store.api.addPeople(this.store.id, [{ name, email: email || null }]).pipe(
        tap((r) => {
          if (r.skipped.length) this.snack.open(`${r.skipped.join(', ')} is already on the list.`, 'OK', { duration: 5000 });
          this.personForm.reset();
          this.store.workshop.set(r.workshop);
          this.store.refreshCounts();
        }),
      ),
    );
  }

  /** Adds the people of a roster file; the lines it could not read are listed under the form. */
  protected uploadRoster(input: HTMLInputElement): void {
    const file = input.files?.[0];
    if (!file) return;
    const sent = from(file.text()).pipe(
      concatMap((csv) => {
        input.value = '';
        return this.store.api.roster(this.store.id, csv);
      }),
      tap((r) => {
        this.rosterIssues.set(r.issues);
        this.snack.open(`${r.added} added${r.skipped.length ? `, ${r.skipped.length} already listed` : ''}.`, 'OK', { duration: 5000 });
      }),
      catchError((err: unknown) => {
        this.rosterIssues.set((toApiError(err).details?.['issues'] as RosterIssue[]) ?? []);
        return of(null);
      }),
    );
    this.store.run(sent.pipe(concatMap(() => this.store.refreshParticipants())));
  }

  protected fromRoom(): void {
    this.store.run(
      this.store.api.fromRoom(this.store.id).pipe(
        tap((r) => this.snack.open(`${r.added} people taken from the room.`, 'OK', { duration: 4000 })),
        concatMap(() => this.store.refreshParticipants()),
      ),
    );
  }

  /** Asks first, then makes the change and reads the participants again. */
  private confirmThen(ask: ConfirmData, change: () => Observable<unknown>): void {
    this.store.run(
      whenConfirmed(this.dialog, ask).pipe(
        concatMap(change),
        concatMap(() => this.store.refreshParticipants()),
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
    this.confirmThen(ask, () => this.store.api.removeParticipant(this.store.id, pid));
  }

  protected resetClaim(pid: number): void {
    this.store.run(
      this.store.api.resetClaim(this.store.id, pid).pipe(
        tap(() => this.snack.open('The name can be picked again; the earlier link no longer works.', 'OK', { duration: 5000 })),
        concatMap(() => this.store.refreshParticipants()),
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
    this.confirmThen(ask, () => this.store.api.revoke(this.store.id, [pid]));
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
    this.chosen.set(new Set(on ? this.workshop().participants.map((p) => p.id) : []));
  }

  /** The separate, confirmed action that replaces links: only the chosen people's links end. */
  protected reissue(ids: number[]): void {
    const w = this.workshop();
    if (!ids.length) return;
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
    this.confirmThen(ask, () =>
      this.store.api.reissue(this.store.id, ids).pipe(
        tap((links) => {
          this.chosen.set(new Set());
          this.sheet.links.set({ workshopId: this.store.id, title: w.title, links, reissued: true });
          this.snack
            .open(`New ${links.length === 1 ? 'link' : 'links'} for ${who}; the old ones no longer work.`, 'Print them', {
              duration: 10000,
            })
            .onAction()
            .subscribe(() => void this.router.navigate(['/workshops', this.store.id, 'sheet']));
        }),
      ),
    );
  }
}
