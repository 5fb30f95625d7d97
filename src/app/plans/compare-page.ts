import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { forkJoin } from 'rxjs';
import type { PlanComparison, PlanDetail } from '../../../shared/api/plans';
import type { RoomDto } from '../../../shared/api/rooms';
import { toApiError } from '../core/api-error';
import { methodLabel } from './method-label';
import { ModelCaution } from './model-caution';
import { PlanMap } from './plan-map';
import { PlansApi } from './plans-api';
import { ReachChart } from './reach-chart';
import type { ReachSeries } from './reach-chart-data';

/** Two plans side by side: starters, scores and their reach curves on one chart. */
@Component({
  selector: 'app-compare-page',
  imports: [DecimalPipe, RouterLink, MatButtonModule, MatIconModule, ModelCaution, PlanMap, ReachChart],
  templateUrl: './compare-page.html',
  styleUrl: './compare-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class ComparePage {
  private readonly api = inject(PlansApi);
  readonly roomId = input.required<string>();
  readonly a = input<string>();
  readonly b = input<string>();

  protected readonly id = computed(() => Number(this.roomId()));
  protected readonly comparison = signal<PlanComparison | null>(null);
  protected readonly details = signal<[PlanDetail, PlanDetail] | null>(null);
  protected readonly room = signal<RoomDto | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly methodLabel = methodLabel;

  protected readonly series = computed<ReachSeries[]>(() => {
    const d = this.details();
    if (!d) return [];
    return d.map((p, i) => ({ label: `${i === 0 ? 'A' : 'B'}: ${p.name}`, share: p.reach?.byHop ?? [], dashed: i === 1 }));
  });
  protected readonly biggest = computed(() => {
    const c = this.comparison();
    if (!c) return [];
    return c.people
      .filter((p) => p.difference !== null && Math.abs(p.difference) > 1e-9)
      .sort((x, y) => Math.abs(y.difference!) - Math.abs(x.difference!))
      .slice(0, 8);
  });
  /** What each plan's map draws: expected hops by person and the starters, for A and B. */
  protected readonly planMaps = computed(() => {
    const d = this.details();
    if (!d) return null;
    const mapOf = (p: PlanDetail) => ({
      hops: new Map(p.perPerson.map((x) => [x.personId, x.expectedHops])),
      starters: p.starters.map((s) => s.personId),
    });
    return [mapOf(d[0]), mapOf(d[1])] as const;
  });

  constructor() {
    effect(() => {
      const [a, b] = [Number(this.a()), Number(this.b())];
      untracked(() => this.load(a, b));
    });
  }

  private load(a: number, b: number): void {
    if (!(a > 0 && b > 0)) {
      this.error.set('Pick two saved plans to compare.');
      return;
    }
    forkJoin([this.api.compare(a, b), this.api.plan(a), this.api.plan(b), this.api.room(this.id())]).subscribe({
      next: ([c, pa, pb, room]) => {
        this.comparison.set(c);
        this.details.set([pa, pb]);
        this.room.set(room);
      },
      error: (e: unknown) => this.error.set(toApiError(e).message),
    });
  }

  /** A plan as good as a certified one is itself the best possible, whatever its own bound says. */
  protected bestNote(c: PlanComparison): string | null {
    const same = c.a.total !== null && c.b.total !== null && Math.abs(c.a.total - c.b.total) <= 1e-9 * Math.max(1, c.a.total);
    if (!same || !c.sameRoomVersion || c.a.certified === c.b.certified) return null;
    const [proven, other] = c.a.certified ? ['A', 'B'] : ['B', 'A'];
    return `${proven} is proven to be the best plan of its size, and ${other} matches it, so ${other} is the best possible too (its own gap to best is only a loose bound).`;
  }

  protected nameOf(id: number): string {
    for (const p of this.details() ?? []) {
      const s = p.starters.find((x) => x.personId === id);
      if (s) return s.name;
    }
    return `#${id}`;
  }
}
