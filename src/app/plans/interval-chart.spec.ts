import { TestBed } from '@angular/core/testing';
import { IntervalChart } from './interval-chart';
import type { IntervalPoint } from './interval-chart-data';
import { itemAt } from '../../../shared/checked';

/** 60 people with long names: the size of the demo all-hands room. Values invented, one disagreement. */
const points: IntervalPoint[] = Array.from({ length: 60 }, (_, i) => ({
  name: `Participant with a long name ${i}`,
  analytic: 10 + i,
  simulated: 10 + i + 0.3,
  low: 9 + i,
  high: i === 7 ? 15 : 11.5 + i,
}));
points[7] = { ...itemAt(points, 7, 'points'), analytic: 30 };

describe('IntervalChart sizing', () => {
  async function renderAt(width: number) {
    const host = document.createElement('div');
    host.style.width = `${width}px`;
    document.body.appendChild(host);
    TestBed.configureTestingModule({ imports: [IntervalChart] });
    const fixture = TestBed.createComponent(IntervalChart);
    fixture.componentRef.setInput('points', points);
    host.appendChild(fixture.nativeElement);
    await fixture.whenStable();
    return { el: fixture.nativeElement as HTMLElement, host, fixture };
  }

  for (const width of [360, 390, 768, 1280, 1920]) {
    it(`fits a ${width} px column: nothing wider than the column, every mark inside its track`, async () => {
      const { el, host } = await renderAt(width);
      expect(el.scrollWidth).withContext('chart width').toBeLessThanOrEqual(width);
      const rows = el.querySelectorAll('.rows .row');
      expect(rows.length).toBe(60);
      for (const row of Array.from(rows)) {
        const track = row.querySelector('.track')!.getBoundingClientRect();
        for (const mark of Array.from(row.querySelectorAll('.bar, .dot, .diamond'))) {
          const r = mark.getBoundingClientRect();
          expect(r.left).toBeGreaterThanOrEqual(track.left - 6);
          expect(r.right).toBeLessThanOrEqual(track.right + 6);
        }
      }
      // The interval stays visible: the bar has width and the diamond is hollow (transparent fill).
      const bar = itemAt(rows, 0, 'rows').querySelector('.bar')!.getBoundingClientRect();
      expect(bar.width).toBeGreaterThan(1);
      expect(getComputedStyle(itemAt(rows, 0, 'rows').querySelector('.diamond')!).backgroundColor).toBe('rgba(0, 0, 0, 0)');
      host.remove();
    });
  }

  it('marks the person whose analysis is outside the interval and offers the numbers as a keyboard-reachable table', async () => {
    const { el, host } = await renderAt(800);
    const outside = el.querySelectorAll('.rows .row.outside');
    expect(outside.length).toBe(1);
    expect(itemAt(outside, 0, 'outside').textContent).toContain('Participant with a long name 7');
    const summary = el.querySelector('details summary') as HTMLElement;
    expect(summary).not.toBeNull();
    summary.focus();
    expect(document.activeElement).toBe(summary);
    expect(el.querySelectorAll('details tbody tr').length).toBe(60);
    expect(el.querySelector('.plot')!.getAttribute('aria-label')).toContain('59 with the analysis inside their interval, 1 outside');
    host.remove();
  });
});
