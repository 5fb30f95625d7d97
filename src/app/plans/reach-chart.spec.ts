import { TestBed } from '@angular/core/testing';
import { provideCharts, withDefaultRegisterables } from 'ng2-charts';
import { BaseChartDirective } from 'ng2-charts';
import { By } from '@angular/platform-browser';
import { ReachChart } from './reach-chart';
import { itemAt } from '../../../shared/checked';

describe('ReachChart', () => {
  it('draws the curve by hop and switches the axis to minutes', async () => {
    TestBed.configureTestingModule({ imports: [ReachChart], providers: [provideCharts(withDefaultRegisterables())] });
    const fixture = TestBed.createComponent(ReachChart);
    // Star with the centre briefed: every leaf asks the centre at once (H = 1; Lovász 1993), so all hear at hop 1.
    fixture.componentRef.setInput('series', [{ label: 'Centre', share: [0, 1] }]);
    fixture.componentRef.setInput('minutesPerHop', 3);
    await fixture.whenStable();
    const chart = fixture.debugElement.query(By.directive(BaseChartDirective)).injector.get(BaseChartDirective);
    expect(chart.data?.datasets[0].data).toEqual([
      { x: 0, y: 0 },
      { x: 1, y: 100 },
    ]);
    itemAt((fixture.nativeElement as HTMLElement).querySelectorAll('mat-button-toggle button'), 1, 'toggle buttons').dispatchEvent(
      new MouseEvent('click'),
    );
    await fixture.whenStable();
    expect(chart.data?.datasets[0].data).toEqual([
      { x: 0, y: 0 },
      { x: 3, y: 100 },
    ]);
    expect(fixture.nativeElement.querySelector('canvas')).toBeTruthy();
  });
});
