import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormGroup, NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { type FormControl } from '@angular/forms';
import { type RoomSettings, SETTINGS_LIMITS } from '../../../../shared/api/rooms';
import { problemValidator, settingProblem } from '../editor/validation';

export type SettingsForm = FormGroup<{
  directed: FormControl<boolean>;
  minutesPerHop: FormControl<number>;
  laziness: FormControl<number>;
  mixing: FormControl<number>;
}>;

export function settingsForm(fb: NonNullableFormBuilder, s: RoomSettings): SettingsForm {
  return fb.group({
    directed: [s.directed],
    minutesPerHop: [s.minutesPerHop, problemValidator((v: unknown) => settingProblem('minutesPerHop', v))],
    laziness: [s.laziness, problemValidator((v: unknown) => settingProblem('laziness', v))],
    mixing: [s.mixing, problemValidator((v: unknown) => settingProblem('mixing', v))],
  });
}

/** The four room settings, each with what it changes in plain words. */
@Component({
  selector: 'app-settings-fields',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSlideToggleModule],
  template: `
    <div class="rh-settings" [formGroup]="form()">
      <div class="rh-setting">
        <mat-slide-toggle formControlName="directed">Ties have a direction</mat-slide-toggle>
        <p class="rh-muted">
          Off: a tie means the two people ask each other. On: a tie reads "source asks target" only, so a person whose ties all point at
          them can only hear if they are a starter or through background mixing.
        </p>
      </div>
      <div class="rh-setting">
        <mat-form-field>
          <mat-label>Minutes per hop</mat-label>
          <input
            matInput
            type="number"
            formControlName="minutesPerHop"
            [min]="limits.minutesPerHop.min"
            [max]="limits.minutesPerHop.max"
            step="0.5"
          />
          <mat-error>{{ form().controls.minutesPerHop.errors?.['problem'] }}</mat-error>
        </mat-form-field>
        <p class="rh-muted">
          How long one "have you heard?" conversation takes in real life. It only turns expected hops into clock time (5 minutes per hop: 3
          hops is about 15 minutes); it does not change who the best starters are.
        </p>
      </div>
      <div class="rh-setting">
        <mat-form-field>
          <mat-label>Laziness</mat-label>
          <input matInput type="number" formControlName="laziness" min="0" [max]="limits.laziness.max" step="0.05" />
          <mat-error>{{ form().controls.laziness.errors?.['problem'] }}</mat-error>
        </mat-form-field>
        <p class="rh-muted">
          The chance that a person lets a round pass instead of asking anyone. Every expected time grows by the same factor, 1 / (1 −
          laziness); the ranking of starters stays the same.
        </p>
      </div>
      <div class="rh-setting">
        <mat-form-field>
          <mat-label>Background mixing</mat-label>
          <input matInput type="number" formControlName="mixing" min="0" [max]="limits.mixing.max" step="0.01" />
          <mat-error>{{ form().controls.mixing.errors?.['problem'] }}</mat-error>
        </mat-form-field>
        <p class="rh-muted">
          The chance that someone asks a random person in the room instead of a usual contact (a chance meeting at the coffee machine). It
          makes every expected time finite, even for people no tie reaches; keep it small.
        </p>
      </div>
    </div>
  `,
  styles: `
    .rh-settings {
      display: grid;
      grid-template-columns: repeat(auto-fit, minmax(min(100%, 340px), 1fr));
      gap: 8px 24px;
    }
    .rh-setting p {
      margin: 0 0 12px;
      font-size: 0.9rem;
    }
    .rh-setting mat-slide-toggle {
      display: block;
      margin: 12px 0 8px;
    }
    mat-form-field {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SettingsFields {
  readonly form = input.required<SettingsForm>();
  protected readonly limits = SETTINGS_LIMITS;
}
