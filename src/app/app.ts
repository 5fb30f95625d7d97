import { ChangeDetectionStrategy, Component, computed, inject, type OnInit } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatToolbarModule } from '@angular/material/toolbar';
import { ActivatedRoute, NavigationEnd, Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { filter, map } from 'rxjs';
import { Auth } from './core/auth';
import { Busy } from './core/busy-interceptor';

interface NavLink {
  path: string;
  label: string;
  icon: string;
}

/** The shell: toolbar with navigation by role. Participant pages and the replay hide it. */
@Component({
  selector: 'app-root',
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatToolbarModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatProgressBarModule,
  ],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App implements OnInit {
  protected readonly auth = inject(Auth);
  protected readonly busy = inject(Busy);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);

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
  protected readonly year = new Date().getFullYear();

  protected readonly links = computed<NavLink[]>(() => {
    const user = this.auth.user();
    if (!user) return [];
    const links: NavLink[] = [
      { path: '/rooms', label: 'Rooms', icon: 'hub' },
      { path: '/workshops', label: 'Workshops', icon: 'groups' },
    ];
    if (user.role === 'admin') links.push({ path: '/admin', label: 'Admin', icon: 'admin_panel_settings' });
    return links;
  });

  ngOnInit(): void {
    this.checkSession();
  }

  /** Pages without a guard (accept invitation, reset) still learn who is signed in, for the toolbar. */
  private checkSession(): void {
    // A participant's phone (/p/…) has no account and no toolbar: it does not ask.
    if (/^\/p(\/|$)/.test(globalThis.location?.pathname ?? '')) return;
    // A failed check leaves the toolbar signed out; the next guarded page asks again.
    this.auth.load().subscribe({ error: () => undefined });
  }

  protected signOut(): void {
    // A failed sign-out keeps the page (the error interceptor has said why).
    this.auth.signOut().subscribe({ next: () => void this.router.navigate(['/sign-in']), error: () => undefined });
  }
}
