import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { MyDebrief } from '../../../shared/api/workshops';

/** A participant's own results: where they sat in the map, and how the room did. */
@Component({
  selector: 'app-debrief-view',
  imports: [DecimalPipe],
  templateUrl: './debrief-view.html',
  styleUrl: './debrief-view.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DebriefView {
  readonly debrief = input.required<MyDebrief>();

  /** The reach curve as an SVG path (0..100 wide, 0..50 high), plus the replayed cascade's steps. */
  protected readonly chart = computed(() => {
    const d = this.debrief();
    // Show the hops where something happens: until 99% are expected to have heard, or the replay ended.
    const nearlyAll = d.reachCurve.findIndex((s) => s >= 0.99);
    const curveEnd = nearlyAll >= 0 ? nearlyAll + 1 : d.reachCurve.length - 1;
    const hops = Math.max(Math.min(curveEnd, d.reachCurve.length - 1), d.replayReached.length - 1, d.heardAtHop ?? 0, 1);
    const x = (t: number) => (t / hops) * 100;
    const y = (share: number) => 50 - share * 50;
    const curve = d.reachCurve
      .slice(0, hops + 1)
      .map((s, t) => `${t ? 'L' : 'M'}${x(t).toFixed(2)},${y(s).toFixed(2)}`)
      .join(' ');
    const total = d.peopleInMap || 1;
    const steps = d.replayReached
      .map(
        (c, t) =>
          `${t ? 'L' : 'M'}${x(t).toFixed(2)},${y(c / total).toFixed(2)}${t < d.replayReached.length - 1 ? ` L${x(t + 1).toFixed(2)},${y(c / total).toFixed(2)}` : ''}`,
      )
      .join(' ');
    const mine = d.heardAtHop !== null ? { x: x(d.heardAtHop), y: y((d.replayReached[d.heardAtHop] ?? 0) / total) } : null;
    const ninety = d.reachCurve.findIndex((s) => s >= 0.9);
    return { curve, steps, mine, hops, ninety: ninety >= 0 ? ninety : null };
  });

  protected minutes(hops: number | null): string {
    const d = this.debrief();
    if (hops === null || d.minutesPerHop === null) return '';
    const m = hops * d.minutesPerHop;
    return m < 90 ? `about ${Math.round(m)} minutes` : `about ${(m / 60).toFixed(1)} hours`;
  }
}
