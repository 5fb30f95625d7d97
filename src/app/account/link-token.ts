import { signal } from '@angular/core';
import { finalize, type Observable } from 'rxjs';
import { toApiError } from '../core/api-error';

/**
 * Removes ?token=… from the address bar once the page has read it, so the link does not stay
 * in the browser history or get copied along with the address.
 */
export function forgetTokenInAddressBar(): void {
  const url = new URL(window.location.href);
  if (!url.searchParams.has('token')) return;
  url.searchParams.delete('token');
  window.history.replaceState(window.history.state, '', url.pathname + url.search + url.hash);
}

/**
 * The state of a page opened from an e-mailed single-use link (invitation, password reset):
 * the token is read once and checked, then used by one submit. A link the server calls
 * invalid at either step turns the page into its "dead link" message.
 */
export class EmailedLink<T> {
  readonly checking = signal(true);
  readonly info = signal<T | null>(null);
  readonly dead = signal<string | null>(null);
  readonly error = signal<string | null>(null);
  readonly pending = signal(false);
  private token = '';

  /** Reads the token and checks it; `checked` gets what the server says about a live link. */
  open(token: string, check: (token: string) => Observable<T>, checked: (info: T) => void = () => undefined): void {
    this.token = token;
    forgetTokenInAddressBar();
    check(token)
      .pipe(finalize(() => this.checking.set(false)))
      .subscribe({
        next: (info) => {
          this.info.set(info);
          checked(info);
        },
        error: (err: unknown) => this.dead.set(toApiError(err).message),
      });
  }

  /** Runs the one use of the link; `done` runs when it worked (else the message is shown). */
  submit<R>(use: (token: string) => Observable<R>, done: (result: R) => void): void {
    this.pending.set(true);
    this.error.set(null);
    use(this.token)
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: done,
        error: (err: unknown) => {
          const e = toApiError(err);
          if (e.code === 'link_invalid') this.dead.set(e.message);
          else this.error.set(e.message);
        },
      });
  }
}
