import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive } from '@angular/router';
import { Auth } from './auth';
import { Busy } from './busy-interceptor';

interface NavLink {
  path: string;
  label: string;
  icon: string;
}

/**
 * The facilitator's toolbar (navigation by role, account menu) and the slim busy bar under it.
 * The shell loads it lazily: a participant's phone page never shows it, so the Material toolbar,
 * menu and progress bar stay out of the code every page fetches first.
 */
@Component({
  selector: 'app-shell-bar',
  imports: [RouterLink, RouterLinkActive, MatToolbarModule, MatButtonModule, MatIconModule, MatMenuModule, MatProgressBarModule],
  templateUrl: './shell-bar.html',
  styleUrl: './shell-bar.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ShellBar {
  /** On the sign-in page itself the sign-in button is pointless. */
  readonly onSignIn = input(false);
  protected readonly auth = inject(Auth);
  protected readonly busy = inject(Busy);
  private readonly router = inject(Router);

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

  protected signOut(): void {
    // A failed sign-out keeps the page (the error interceptor has said why).
    this.auth.signOut().subscribe({ next: () => void this.router.navigate(['/sign-in']), error: () => undefined });
  }
}
