import { HttpClient } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { defer, finalize, map, type Observable, of, shareReplay, tap } from 'rxjs';
import type { AccountRole } from '../../../shared/api/accounts';
import { requestFlags } from './request-flags';

export interface Account {
  id: number;
  email: string;
  name: string;
  role: AccountRole;
}

/** Who is signed in. Loaded once at start-up and after sign-in / sign-out. */
@Injectable({ providedIn: 'root' })
export class Auth {
  private readonly http = inject(HttpClient);
  private readonly current = signal<Account | null | undefined>(undefined);
  /** The first check while it is in flight: the guard and the shell bar share one request. */
  private asking: Observable<Account | null> | null = null;

  /** undefined while the first check is in flight, null when signed out. */
  readonly user = this.current.asReadonly();
  readonly signedIn = computed(() => !!this.current());
  readonly isAdmin = computed(() => this.current()?.role === 'admin');

  /** Who is signed in: asks the server only while nobody knows yet. */
  load(): Observable<Account | null> {
    return defer(() => {
      const known = this.current();
      if (known !== undefined) return of(known);
      this.asking ??= this.http.get<{ user: Account | null }>('/api/auth/me').pipe(
        map((res) => res.user),
        tap((user) => this.current.set(user)),
        finalize(() => (this.asking = null)),
        shareReplay({ bufferSize: 1, refCount: true }),
      );
      return this.asking;
    });
  }

  /**
   * Signs in. `warning` is set when the server accepted the password but the browser will not
   * keep the session (a Secure cookie over plain http): the form shows it instead of moving on.
   */
  signIn(email: string, password: string): Observable<{ user: Account; warning?: string }> {
    // The sign-in form shows its own error beside the button; no snackbar that outlives the page.
    const own = { context: requestFlags({ ownErrors: true }) };
    return this.http
      .post<{ user: Account; warning?: string }>('/api/auth/sign-in', { email, password }, own)
      .pipe(tap((res) => this.current.set(res.user)));
  }

  signOut(): Observable<void> {
    return this.http.post('/api/auth/sign-out', {}).pipe(map(() => this.current.set(null)));
  }

  /** Called when the server answers 401: the session ended elsewhere. */
  markSignedOut(): void {
    this.current.set(null);
  }
}
