import { ChangeDetectionStrategy, Component, inject, signal, type OnInit } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTabsModule } from '@angular/material/tabs';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { AdminApi } from './admin-api';

/** The admin console frame: a tab per page; the outbox tab only while the mail fake is on. */
@Component({
  selector: 'app-admin-shell',
  imports: [RouterOutlet, RouterLink, RouterLinkActive, MatTabsModule, MatIconModule],
  template: `
    <section class="rh-page">
      <h1 class="rh-page-title">Admin</h1>
      <nav mat-tab-nav-bar mat-stretch-tabs="false" mat-align-tabs="start" [tabPanel]="panel" aria-label="Admin pages">
        @for (tab of tabs(); track tab.path) {
          <a mat-tab-link [routerLink]="tab.path" routerLinkActive #active="routerLinkActive" [active]="active.isActive">
            <mat-icon>{{ tab.icon }}</mat-icon>{{ tab.label }}
          </a>
        }
      </nav>
      <mat-tab-nav-panel #panel class="rh-admin-panel">
        <router-outlet />
      </mat-tab-nav-panel>
    </section>
  `,
  styles: `
    .rh-admin-panel {
      display: block;
      padding-top: 16px;
    }
    mat-icon {
      margin-right: 6px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class AdminShell implements OnInit {
  private readonly api = inject(AdminApi);
  private readonly base = [
    { path: 'accounts', label: 'Accounts', icon: 'manage_accounts' },
    { path: 'audit', label: 'Audit log', icon: 'history' },
  ];
  protected readonly tabs = signal(this.base);

  ngOnInit(): void {
    this.loadTabs();
  }

  private loadTabs(): void {
    // Without the settings the outbox tab stays hidden (its guard would refuse it anyway).
    this.api.settings().subscribe({
      next: (settings) => {
        if (settings.mailFake) this.tabs.set([...this.base, { path: 'outbox', label: 'Outbox', icon: 'outgoing_mail' }]);
      },
      error: () => undefined,
    });
  }
}
