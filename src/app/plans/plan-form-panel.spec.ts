import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { CreatePlanRequest } from '../../../shared/api/plans';
import type { PersonDto } from '../../../shared/api/rooms';
import { PlanFormPanel } from './plan-form-panel';

const people: PersonDto[] = Array.from({ length: 6 }, (_, i) => ({
  id: 10 + i,
  key: `k${i}`,
  name: `Person ${i}`,
  group: null,
  email: null,
  x: null,
  y: null,
  pinned: false,
}));

describe('PlanFormPanel', () => {
  async function setup() {
    TestBed.configureTestingModule({
      imports: [PlanFormPanel],
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])],
    });
    const fixture = TestBed.createComponent(PlanFormPanel);
    fixture.componentRef.setInput('people', people);
    const sent: CreatePlanRequest[] = [];
    fixture.componentInstance.submitted.subscribe((r) => sent.push(r));
    await fixture.whenStable();
    return { fixture, sent, el: fixture.nativeElement as HTMLElement };
  }

  it('shows the room-size bound under the budget field and sends nothing while it is broken', async () => {
    const { fixture, sent, el } = await setup();
    const k = el.querySelector<HTMLInputElement>('input[type=number]')!;
    expect(el.textContent).toContain('1 to 5 of 6 people');
    k.value = '6';
    k.dispatchEvent(new Event('input'));
    k.dispatchEvent(new Event('blur'));
    el.querySelector<HTMLButtonElement>('button[type=submit]')!.click();
    await fixture.whenStable();
    expect(el.querySelector('mat-error')?.textContent).toContain('At most 5 in a room of 6');
    expect(sent).toEqual([]);
  });

  it('sends the budget, method and constraints when valid', async () => {
    const { fixture, sent, el } = await setup();
    const k = el.querySelector<HTMLInputElement>('input[type=number]')!;
    k.value = '2';
    k.dispatchEvent(new Event('input'));
    el.querySelector<HTMLButtonElement>('button[type=submit]')!.click();
    await fixture.whenStable();
    expect(sent).toEqual([{ k: 2, method: 'auto', mustBrief: [], cannotBrief: [] }]);
  });
});
