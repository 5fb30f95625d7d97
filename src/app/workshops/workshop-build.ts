import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatRadioModule } from '@angular/material/radio';
import { concatMap, tap } from 'rxjs';
import { BUILD_MODES, type BuildMode, type BuildResult, type WorkshopDetail } from '../../../shared/api/workshops';
import { WorkshopStore } from './workshop-store';

/** The workshop page's build panel: how the answers become ties, who has not answered, and the build itself. */
@Component({
  selector: 'app-workshop-build',
  imports: [MatButtonModule, MatRadioModule],
  templateUrl: './workshop-build.html',
  styleUrl: './workshops.scss',
  // The panel's section is itself one cell of the page's grid.
  styles: ':host { display: contents; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WorkshopBuild {
  readonly workshop = input.required<WorkshopDetail>();
  private readonly store = inject(WorkshopStore);
  protected readonly modes = BUILD_MODES;
  protected readonly mode = this.store.mode;
  protected readonly missing = this.store.missing;
  protected readonly built = signal<BuildResult | null>(null);

  protected setMode(mode: BuildMode): void {
    this.store.mode.set(mode);
    this.store.run(this.store.loadMissing());
  }

  protected build(): void {
    const { store } = this;
    store.run(
      store.api.build(store.id, store.mode()).pipe(
        tap((r) => {
          this.built.set(r);
          store.missing.set(r.missing);
        }),
        concatMap(() => store.api.detail(store.id)),
        tap((w) => store.workshop.set(w)),
        concatMap(() => store.loadRehearsals()),
      ),
    );
  }
}
