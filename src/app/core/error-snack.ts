import { inject, Injectable, Injector, PendingTasks } from '@angular/core';
import type { MatSnackBar, MatSnackBarConfig, MatSnackBarRef, TextOnlySnackBar } from '@angular/material/snack-bar';
import { NavigationStart, Router } from '@angular/router';
import { filter } from 'rxjs';

/**
 * The snackbar for a server error. An error belongs to the page it happened on: leaving the page
 * closes it, so a failed attempt never greets you on the next page. (Confirmations such as
 * "Workshop deleted" use MatSnackBar directly and may follow the navigation they announce.)
 *
 * The snackbar's code (with Material's overlay) is fetched on the first message, not with the
 * app: every page, a participant's phone page too, starts without it.
 */
@Injectable({ providedIn: 'root' })
export class ErrorSnack {
  private readonly injector = inject(Injector);
  private readonly pending = inject(PendingTasks);
  private bar: Promise<MatSnackBar> | null = null;
  private current: MatSnackBarRef<TextOnlySnackBar> | null = null;
  /** Counts messages and page changes: a message whose code arrives after either is dropped. */
  private turn = 0;
  private last: Promise<void> = Promise.resolve();

  constructor() {
    inject(Router)
      .events.pipe(filter((e) => e instanceof NavigationStart))
      .subscribe(() => this.dismiss());
  }

  show(message: string): void {
    this.open(message, 'Dismiss', { duration: 8000, panelClass: 'rh-snack-error' }, true);
  }

  /** A message that may outlive the page change it follows (the sign-in page's "session ended"). */
  announce(message: string): void {
    this.open(message, 'OK', { duration: 6000 }, false);
  }

  dismiss(): void {
    this.turn++;
    this.current?.dismiss();
    this.current = null;
  }

  /** Resolves once the latest message is on the screen (or was dropped): for tests. */
  settled(): Promise<void> {
    return this.last;
  }

  private open(message: string, action: string, options: MatSnackBarConfig, ownsPage: boolean): void {
    const turn = ++this.turn;
    this.bar ??= import('@angular/material/snack-bar').then((m) => this.injector.get(m.MatSnackBar));
    // Counted as work in progress, so the app (and a test) is not "stable" until it is shown.
    const done = this.pending.add();
    this.last = this.bar.then(
      (bar) => {
        if (turn !== this.turn) return;
        const ref = bar.open(message, action, options);
        if (!ownsPage) return;
        this.current = ref;
        ref.afterDismissed().subscribe(() => {
          if (this.current === ref) this.current = null;
        });
      },
      // The code could not be fetched (offline): the page shows the failure its own way too.
      () => {
        this.bar = null;
      },
    );
    void this.last.finally(done);
  }
}
