import { ChangeDetectionStrategy, Component, computed, effect, inject, input, untracked } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import { tap } from 'rxjs';
import { REHEARSAL_LIMITS } from '../../../shared/api/plans';
import type { WorkshopDetail } from '../../../shared/api/workshops';
import { DateTimePipe } from '../core/date-format';
import { WorkshopStore } from './workshop-store';

/** The workshop page's debrief panel: the room's finished rehearsals and the release of one to the participants. */
@Component({
  selector: 'app-workshop-debrief',
  imports: [
    DateTimePipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatSelectModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './workshop-debrief.html',
  styleUrl: './workshops.scss',
  // The panel's section is itself one cell of the page's grid.
  styles: ':host { display: contents; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WorkshopDebrief {
  readonly workshop = input.required<WorkshopDetail>();
  private readonly store = inject(WorkshopStore);
  private readonly snack = inject(MatSnackBar);
  protected readonly sampleChoices = Array.from({ length: REHEARSAL_LIMITS.samples }, (_, i) => i);
  protected readonly doneRehearsals = computed(() => this.store.rehearsals().filter((r) => r.status === 'done'));
  protected readonly releaseForm = new FormGroup({
    rehearsalId: new FormControl<number | null>(null, Validators.required),
    sampleRun: new FormControl(0, { nonNullable: true }),
    showStarters: new FormControl(false, { nonNullable: true }),
  });

  constructor() {
    effect(() => {
      const show = this.workshop().showStarters;
      untracked(() => this.releaseForm.controls.showStarters.setValue(show));
    });
  }

  protected release(): void {
    const v = this.releaseForm.getRawValue();
    if (v.rehearsalId === null) return;
    this.store.run(
      this.store.api.release(this.store.id, { rehearsalId: v.rehearsalId, sampleRun: v.sampleRun, showStarters: v.showStarters }).pipe(
        tap((w) => {
          this.store.workshop.set(w);
          this.snack.open('Results released: participants now see their debrief on their own link.', 'OK', { duration: 6000 });
        }),
      ),
    );
  }

  protected toggleStarters(show: boolean): void {
    this.store.run(this.store.api.patch(this.store.id, { showStarters: show }).pipe(tap((w) => this.store.workshop.set(w))));
  }

  protected refreshRehearsals(): void {
    this.store.run(this.store.loadRehearsals());
  }
}
