import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule } from '@angular/material/dialog';
import { filter, type Observable } from 'rxjs';

export interface ConfirmData {
  title: string;
  message: string;
  confirm: string;
  /** Shown in the warning colour: the action ends access or cannot be undone quietly. */
  danger?: boolean;
}

/** A yes / no question before an action that ends access or cannot be undone quietly. */
@Component({
  selector: 'app-confirm-dialog',
  imports: [MatDialogModule, MatButtonModule],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content>
      <p>{{ data.message }}</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button [mat-dialog-close]="false">Cancel</button>
      <button mat-flat-button [class.rh-danger]="data.danger" [mat-dialog-close]="true" cdkFocusInitial>{{ data.confirm }}</button>
    </mat-dialog-actions>
  `,
  styles: `
    .rh-danger {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ConfirmDialog {
  protected readonly data = inject<ConfirmData>(MAT_DIALOG_DATA);
}

/** Opens the question; emits once when the person confirmed, and completes without a value otherwise. */
export function whenConfirmed(dialog: MatDialog, data: ConfirmData): Observable<true> {
  const ref = dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, { data, width: '460px', autoFocus: 'dialog' });
  return ref.afterClosed().pipe(filter((v): v is true => v === true));
}
