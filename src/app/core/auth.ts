import { HttpClient, HttpContext } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { AccountRole } from '../../../shared/api/accounts';
import { HANDLES_ERRORS } from './handles-errors';

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

  /** undefined while the first check is in flight, null when signed out. */
  readonly user = this.current.asReadonly();
  readonly signedIn = computed(() => !!this.current());
  readonly isAdmin = computed(() => this.current()?.role === 'admin');

  async load(): Promise<Account | null> {
    if (this.current() !== undefined) return this.current() ?? null;
    const res = await firstValueFrom(this.http.get<{ user: Account | null }>('/api/auth/me'));
    this.current.set(res.user);
    return res.user;
  }

  /**
   * Signs in. `warning` is set when the server accepted the password but the browser will not
   * keep the session (a Secure cookie over plain http): the form shows it instead of moving on.
   */
  async signIn(email: string, password: string): Promise<{ user: Account; warning?: string }> {
    // The sign-in form shows its own error beside the button; no snackbar that outlives the page.
    const own = { context: new HttpContext().set(HANDLES_ERRORS, true) };
    const res = await firstValueFrom(this.http.post<{ user: Account; warning?: string }>('/api/auth/sign-in', { email, password }, own));
    this.current.set(res.user);
    return res;
  }

  async signOut(): Promise<void> {
    await firstValueFrom(this.http.post('/api/auth/sign-out', {}));
    this.current.set(null);
  }

  /** Called when the server answers 401: the session ended elsewhere. */
  markSignedOut(): void {
    this.current.set(null);
  }
}
