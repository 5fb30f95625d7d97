import { signal } from '@angular/core';
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

  async open(token: string, check: (token: string) => Promise<T>): Promise<T | null> {
    this.token = token;
    forgetTokenInAddressBar();
    try {
      const info = await check(token);
      this.info.set(info);
      return info;
    } catch (err) {
      this.dead.set(toApiError(err).message);
      return null;
    } finally {
      this.checking.set(false);
    }
  }

  /** Runs the one use of the link; undefined when it failed (the message is then shown). */
  async submit<R>(use: (token: string) => Promise<R>): Promise<R | undefined> {
    this.pending.set(true);
    this.error.set(null);
    try {
      return await use(this.token);
    } catch (err) {
      const e = toApiError(err);
      if (e.code === 'link_invalid') this.dead.set(e.message);
      else this.error.set(e.message);
      return undefined;
    } finally {
      this.pending.set(false);
    }
  }
}
