import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { concatMap, tap } from 'rxjs';
import type { WorkshopDetail } from '../../../shared/api/workshops';
import { LinkSheetStore } from './link-sheet-store';
import { WorkshopStore } from './workshop-store';

/** The workshop page's survey panel: the live count of answers and the ways to hand out the links. */
@Component({
  selector: 'app-workshop-survey',
  imports: [MatButtonModule, MatIconModule, RouterLink],
  templateUrl: './workshop-survey.html',
  styleUrl: './workshops.scss',
  // The panel's section is itself one cell of the page's grid.
  styles: ':host { display: contents; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WorkshopSurvey {
  readonly workshop = input.required<WorkshopDetail>();
  private readonly store = inject(WorkshopStore);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly sheet = inject(LinkSheetStore);
  protected readonly progress = this.store.progress;

  protected emailLinks(): void {
    this.store.run(
      this.store.api.email(this.store.id).pipe(
        tap((r) => {
          const parts = [`Sent to ${r.sent.length}.`];
          if (r.withoutEmail.length) parts.push(`${r.withoutEmail.length} without an address: print their links or use the QR code.`);
          if (r.failed.length) parts.push(`Could not send to ${r.failed.join(', ')}; their links are unchanged.`);
          this.snack.open(parts.join(' '), 'OK', { duration: 8000 });
        }),
        concatMap(() => this.store.refreshParticipants()),
      ),
    );
  }

  protected printSheet(): void {
    this.sheet.links.set(null);
    void this.router.navigate(['/workshops', this.store.id, 'sheet']);
  }
}
