import { TestBed } from '@angular/core/testing';
import { PlanProgress } from './plan-progress';

function buttons(el: HTMLElement): HTMLButtonElement[] {
  return Array.from(el.querySelectorAll('button'));
}

describe('PlanProgress', () => {
  it('offers "Stop, keep the best" once a search has a best plan, beside Cancel, and emits the matching output', async () => {
    TestBed.configureTestingModule({ imports: [PlanProgress] });
    const fixture = TestBed.createComponent(PlanProgress);
    fixture.componentRef.setInput('progress', 0.2);
    fixture.componentRef.setInput('people', 60);
    fixture.componentRef.setInput('k', 10);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    // Nothing found yet: only Cancel (there is no plan to keep).
    expect(buttons(el).map((b) => b.textContent?.trim())).toEqual(['stop_circleCancel']);

    fixture.componentRef.setInput('search', {
      stage: 'exhaustive',
      closed: 0.3,
      bestTotal: 250,
      lowerBound: 200,
      gapShare: 0.2,
      nodes: 1000,
    });
    await fixture.whenStable();
    const labels = buttons(el).map((b) => b.textContent?.trim());
    expect(labels).toEqual(['flagStop, keep the best', 'stop_circleCancel']);

    let stopped = 0;
    let cancelled = 0;
    fixture.componentInstance.stopped.subscribe(() => stopped++);
    fixture.componentInstance.cancelled.subscribe(() => cancelled++);
    buttons(el)[0]!.click();
    expect([stopped, cancelled]).toEqual([1, 0]);
    buttons(el)[1]!.click();
    expect([stopped, cancelled]).toEqual([1, 1]);

    // While the plan waits in the queue there is no search to stop.
    fixture.componentRef.setInput('position', 2);
    await fixture.whenStable();
    expect(buttons(el).length).toBe(1);
  });
});
