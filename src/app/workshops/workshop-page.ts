import { ChangeDetectionStrategy, Component, computed, inject, input, type OnInit } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { concatMap, from, tap } from 'rxjs';
import { STATUS_LABELS, WORKSHOP_STATUSES, type WorkshopStatus } from '../../../shared/api/workshops';
import { type ConfirmData, whenConfirmed } from '../core/confirm-dialog';
import { DayPipe } from '../core/date-format';
import { WorkshopBuild } from './workshop-build';
import { WorkshopDebrief } from './workshop-debrief';
import { WorkshopParticipants } from './workshop-participants';
import { WorkshopStore } from './workshop-store';
import { WorkshopSurvey } from './workshop-survey';
import { WorkshopTeam } from './workshop-team';

/**
 * One workshop: its status and the moves between them, and one panel each for the survey count
 * and links, the team, the participants, the room build and the debrief (WorkshopStore holds
 * what they share).
 */
@Component({
  selector: 'app-workshop-page',
  imports: [
    DayPipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    WorkshopBuild,
    WorkshopDebrief,
    WorkshopParticipants,
    WorkshopSurvey,
    WorkshopTeam,
  ],
  templateUrl: './workshop-page.html',
  styleUrl: './workshops.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [WorkshopStore],
})
export default class WorkshopPage implements OnInit {
  readonly id = input.required<string>();
  protected readonly store = inject(WorkshopStore);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);

  protected readonly labels = STATUS_LABELS;
  protected readonly steps = WORKSHOP_STATUSES;
  protected readonly stepIndex = computed(() => WORKSHOP_STATUSES.indexOf(this.store.workshop()?.status ?? 'draft'));

  ngOnInit(): void {
    this.store.open(Number(this.id()));
  }

  protected move(to: WorkshopStatus): void {
    const { store } = this;
    const ask = this.moveQuestion(to);
    const moved = store.api.move(store.id, to).pipe(
      tap((w) => store.workshop.set(w)),
      concatMap(() => store.poll()),
    );
    store.run(ask ? whenConfirmed(this.dialog, ask).pipe(concatMap(() => moved)) : moved);
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
    if (to === 'running' && this.store.workshop()?.status === 'collecting') {
      const p = this.store.progress();
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

  protected deleteWorkshop(): void {
    const w = this.store.workshop();
    if (!w) return;
    const ask: ConfirmData = {
      title: `Delete “${w.title}”?`,
      message: 'Its participants, their links and every survey answer are deleted. The room stays.',
      confirm: 'Delete the workshop',
      danger: true,
    };
    this.store.run(
      whenConfirmed(this.dialog, ask).pipe(
        concatMap(() => this.store.api.remove(this.store.id)),
        concatMap(() => {
          this.snack.open('The workshop and all its survey data are deleted.', 'OK', { duration: 5000 });
          return from(this.router.navigate(['/workshops']));
        }),
      ),
    );
  }
}
