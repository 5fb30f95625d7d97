import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormGroup, ReactiveFormsModule, type FormControl } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { PASSWORD_RULE } from './new-password';

/** Two fields: the new password and its repeat, with the rule spelled out. */
@Component({
  selector: 'app-new-password-fields',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  template: `
    <ng-container [formGroup]="group()">
      <mat-form-field appearance="outline">
        <mat-label>{{ label() }}</mat-label>
        <input matInput type="password" formControlName="password" autocomplete="new-password" required />
        <mat-hint>At least {{ rule.min }} characters. A few unrelated words make a strong one.</mat-hint>
        @if (controls().password.hasError('required')) {
          <mat-error>Choose a password.</mat-error>
        } @else if (controls().password.hasError('minlength')) {
          <mat-error>Use at least {{ rule.min }} characters.</mat-error>
        } @else if (controls().password.hasError('maxlength')) {
          <mat-error>Use at most {{ rule.max }} characters.</mat-error>
        } @else if (controls().password.hasError('server')) {
          <mat-error>{{ controls().password.getError('server') }}</mat-error>
        }
      </mat-form-field>
      <mat-form-field appearance="outline">
        <mat-label>Repeat the password</mat-label>
        <input matInput type="password" formControlName="repeat" autocomplete="new-password" required />
        @if (controls().repeat.hasError('required')) {
          <mat-error>Type the password again.</mat-error>
        } @else if (controls().repeat.hasError('mismatch')) {
          <mat-error>The two passwords differ.</mat-error>
        }
      </mat-form-field>
    </ng-container>
  `,
  styles: `
    :host {
      display: contents;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewPasswordFields {
  readonly group = input.required<FormGroup<{ password: FormControl<string>; repeat: FormControl<string> }>>();
  readonly label = input('New password');
  protected readonly rule = PASSWORD_RULE;
  protected controls() {
    return this.group().controls;
  }
}
