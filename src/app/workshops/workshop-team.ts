import { ChangeDetectionStrategy, Component, effect, inject, input, untracked } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { concatMap, tap } from 'rxjs';
import { NOMINATION_LIMIT_MAX, type WorkshopDetail } from '../../../shared/api/workshops';
import { WorkshopStore } from './workshop-store';

/** The workshop page's team panel: who runs the workshop, and the survey's settings. */
@Component({
  selector: 'app-workshop-team',
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './workshop-team.html',
  styleUrl: './workshops.scss',
  // The panel's section is itself one cell of the page's grid.
  styles: ':host { display: contents; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WorkshopTeam {
  readonly workshop = input.required<WorkshopDetail>();
  private readonly store = inject(WorkshopStore);
  private readonly snack = inject(MatSnackBar);
  protected readonly limitMax = NOMINATION_LIMIT_MAX;
  protected readonly facilitatorForm = new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.email] }),
  });
  protected readonly settingsForm = new FormGroup({
    nominationLimit: new FormControl(5, {
      nonNullable: true,
      validators: [Validators.required, Validators.min(1), Validators.max(NOMINATION_LIMIT_MAX)],
    }),
    linkDays: new FormControl(30, { nonNullable: true, validators: [Validators.required, Validators.min(1), Validators.max(365)] }),
  });

  constructor() {
    effect(() => {
      const w = this.workshop();
      untracked(() => this.showSettings(w));
    });
  }

  /** The saved settings, unless the facilitator is in the middle of changing them. */
  private showSettings(w: WorkshopDetail): void {
    if (this.settingsForm.pristine) this.settingsForm.reset({ nominationLimit: w.nominationLimit, linkDays: w.linkDays });
  }

  protected addFacilitator(): void {
    if (this.facilitatorForm.invalid) return;
    this.store.run(
      this.store.api.addFacilitator(this.store.id, this.facilitatorForm.getRawValue().email).pipe(
        tap((w) => {
          this.store.workshop.set(w);
          this.facilitatorForm.reset();
        }),
      ),
    );
  }

  protected removeFacilitator(userId: number): void {
    this.store.run(this.store.api.removeFacilitator(this.store.id, userId).pipe(concatMap(() => this.store.reload())));
  }

  protected saveSettings(): void {
    if (this.settingsForm.invalid) return;
    this.store.run(
      this.store.api.patch(this.store.id, this.settingsForm.getRawValue()).pipe(
        tap((w) => {
          this.settingsForm.markAsPristine();
          this.store.workshop.set(w);
          this.snack.open('Settings saved.', 'OK', { duration: 3000 });
        }),
      ),
    );
  }
}
