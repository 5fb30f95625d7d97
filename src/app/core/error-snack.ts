import { inject, Injectable } from '@angular/core';
import { MatSnackBar, type MatSnackBarRef, type TextOnlySnackBar } from '@angular/material/snack-bar';
import { NavigationStart, Router } from '@angular/router';
import { filter } from 'rxjs';

/**
 * The snackbar for a server error. An error belongs to the page it happened on: leaving the page
 * closes it, so a failed attempt never greets you on the next page. (Confirmations such as
 * "Workshop deleted" use MatSnackBar directly and may follow the navigation they announce.)
 */
@Injectable({ providedIn: 'root' })
export class ErrorSnack {
  private readonly snackBar = inject(MatSnackBar);
  private current: MatSnackBarRef<TextOnlySnackBar> | null = null;

  constructor() {
    inject(Router)
      .events.pipe(filter((e) => e instanceof NavigationStart))
      .subscribe(() => this.dismiss());
  }

  show(message: string): void {
    const ref = this.snackBar.open(message, 'Dismiss', { duration: 8000, panelClass: 'rh-snack-error' });
    this.current = ref;
    ref.afterDismissed().subscribe(() => {
      if (this.current === ref) this.current = null;
    });
  }

  dismiss(): void {
    this.current?.dismiss();
    this.current = null;
  }
}
