import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { SeatingResult } from '../../../../shared/seating/seating';
import { groupStyles, shapePath } from '../map/group-style';
import { itemAt } from '../../../../shared/checked';

/** A small drawing of the generated seating: seats by group shape and colour, ties by kind. */
@Component({
  selector: 'app-seating-preview',
  template: `
    @if (view(); as v) {
      <svg [attr.viewBox]="v.box" role="img" [attr.aria-label]="'Preview of ' + v.people.length + ' seats'">
        @for (t of v.ties; track $index) {
          <line
            [attr.x1]="t.x1"
            [attr.y1]="t.y1"
            [attr.x2]="t.x2"
            [attr.y2]="t.y2"
            [attr.stroke]="t.colour"
            [attr.stroke-width]="t.w"
            [attr.stroke-dasharray]="t.dash"
          />
        }
        @for (p of v.people; track $index) {
          <path
            [attr.d]="p.d"
            [attr.fill]="p.fill"
            stroke="#16324a"
            stroke-width="1"
            [attr.transform]="'translate(' + p.x + ',' + p.y + ')'"
          >
            <title>{{ p.name }} · {{ p.group }}</title>
          </path>
        }
      </svg>
    }
  `,
  styles: `
    svg {
      width: 100%;
      height: 100%;
      display: block;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SeatingPreview {
  readonly result = input.required<SeatingResult>();

  protected readonly view = computed(() => {
    const r = this.result();
    const styles = groupStyles([...new Set(r.people.map((p) => p.group))].sort((a, b) => a.localeCompare(b, undefined, { numeric: true })));
    const xs = r.people.map((p) => p.x);
    const ys = r.people.map((p) => p.y);
    const pad = 24;
    const x0 = Math.min(...xs) - pad;
    const y0 = Math.min(...ys) - pad;
    const box = `${x0} ${y0} ${Math.max(...xs) - x0 + pad} ${Math.max(...ys) - y0 + pad}`;
    const ties = r.ties.map((t) => {
      const a = itemAt(r.people, t.source, 'seated person');
      const b = itemAt(r.people, t.target, 'seated person');
      return {
        x1: a.x,
        y1: a.y,
        x2: b.x,
        y2: b.y,
        colour: t.kind === 'neighbour' ? '#5b7065' : t.kind === 'mingle' ? '#c2603a' : '#b9c1c9',
        w: t.kind === 'neighbour' ? 2.2 : 1,
        dash: t.kind === 'mingle' ? '5 4' : null,
      };
    });
    const people = r.people.map((p) => {
      const s = styles.get(p.group)!;
      return { x: p.x, y: p.y, d: shapePath(s.shape, 8), fill: s.fill, name: p.name, group: p.group };
    });
    return { box, ties, people };
  });
}
