import { isPlatformBrowser } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, type OnInit, PLATFORM_ID } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute, NavigationEnd, Router, RouterOutlet } from '@angular/router';
import { filter, map } from 'rxjs';
import { Auth } from './core/auth';
import { ShellBar } from './core/shell-bar';

/**
 * The shell: the toolbar (deferred, see ShellBar), the page and the footer. Participant pages
 * and the replay hide toolbar and footer, and never fetch the toolbar's code.
 */
@Component({
  selector: 'app-root',
  imports: [RouterOutlet, ShellBar],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App implements OnInit {
  private readonly auth = inject(Auth);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly inBrowser = isPlatformBrowser(inject(PLATFORM_ID));

  private readonly navigated = toSignal(
    this.router.events.pipe(
      filter((e) => e instanceof NavigationEnd),
      map((e) => {
        let r = this.route.snapshot;
        while (r.firstChild) r = r.firstChild;
        return { bare: !!r.data['bare'], url: e.urlAfterRedirects };
      }),
    ),
    { initialValue: { bare: true, url: '' } },
  );

  /** Routes with data.bare (participant pages, projector replay) show no shell. */
  protected readonly bare = computed(() => this.navigated().bare);
  /** The sign-in button is pointless on the sign-in page itself. */
  protected readonly onSignIn = computed(() => this.navigated().url.startsWith('/sign-in'));

  ngOnInit(): void {
    this.checkSession();
  }

  /** Pages without a guard (accept invitation, reset) still learn who is signed in, for the toolbar. */
  private checkSession(): void {
    // Drawn on the server (a participant's page): there is no one to ask about.
    if (!this.inBrowser) return;
    // A participant's phone (/p/…) has no account and no toolbar: it does not ask.
    if (/^\/p(\/|$)/.test(globalThis.location?.pathname ?? '')) return;
    // A failed check leaves the toolbar signed out; the next guarded page asks again.
    this.auth.load().subscribe({ error: () => undefined });
  }
}
