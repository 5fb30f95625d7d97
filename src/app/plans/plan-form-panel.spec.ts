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
    const el = fixture.nativeElement as HTMLElement;
    return {
      fixture,
      sent,
      el,
      box: el.querySelector<HTMLInputElement>('input[type=number][formcontrolname=k]')!,
      slider: el.querySelector<HTMLInputElement>('input[type=range]')!,
      submit: el.querySelector<HTMLButtonElement>('button[type=submit]')!,
    };
  }
  const type = (input: HTMLInputElement, value: string) => {
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };

  it('shows the bound under the budget field at once and keeps submit disabled while it is broken', async () => {
    const { fixture, sent, el, box, submit } = await setup();
    expect(el.textContent).toContain('1 to 5 of 6 people');
    type(box, '6');
    await fixture.whenStable();
    expect(el.querySelector('mat-error')?.textContent).toContain('At most 5 in a room of 6');
    expect(submit.disabled).toBeTrue();
    submit.click();
    expect(sent).toEqual([]);
    type(box, '-3');
    await fixture.whenStable();
    expect(el.querySelector('mat-error')?.textContent).toContain('Brief at least 1 person');
    type(box, '3');
    await fixture.whenStable();
    expect(el.querySelector('mat-error')).withContext('the message clears once fixed').toBeNull();
    expect(submit.disabled).toBeFalse();
  });

  it('the slider and the box are one control: moving either moves the other, and the plan uses that value', async () => {
    const { fixture, sent, box, slider, submit } = await setup();
    type(slider, '2');
    slider.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect(box.value).toBe('2');
    type(box, '5');
    await fixture.whenStable();
    expect(slider.value).toBe('5');
    submit.click();
    await fixture.whenStable();
    expect(sent).toEqual([{ k: 5, method: 'auto', mustBrief: [], cannotBrief: [] }]);
  });

  it('shows a server message under its field until the form changes', async () => {
    const { fixture, el, box } = await setup();
    fixture.componentRef.setInput('serverProblem', { message: 'Only 3 of 6 people may be briefed.', field: 'cannotBrief' });
    await fixture.whenStable();
    expect(el.textContent).toContain('Only 3 of 6 people may be briefed.');
    expect(el.querySelector('.server-error')).withContext('not shown over the button').toBeNull();
    type(box, '2');
    await fixture.whenStable();
    expect(el.textContent).not.toContain('Only 3 of 6 people may be briefed.');
  });

  it('sends the no-show chance as a share, and refuses more than 50 %', async () => {
    const { fixture, sent, el, box, submit } = await setup();
    type(box, '2');
    const ns = el.querySelector<HTMLInputElement>('input[formcontrolname=noShowPercent]')!;
    type(ns, '60');
    await fixture.whenStable();
    expect(submit.disabled).toBeTrue();
    expect(el.textContent).toContain('The no-show chance is 0 to 50 %.');
    type(ns, '20');
    await fixture.whenStable();
    submit.click();
    expect(sent).toEqual([{ k: 2, method: 'auto', mustBrief: [], cannotBrief: [], noShow: 0.2 }]);
  });
});
