import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { SurveyState } from '../../../shared/api/workshops';
import { SurveyForm } from './survey-form';

const STATE: SurveyState = {
  workshopTitle: 'Harbour office all-hands',
  sessionDate: '2026-05-14',
  facilitatorNames: ['Noor Valensky'],
  me: { id: 1, name: 'Ada Quillon' },
  status: 'collecting',
  open: true,
  nominationLimit: 2,
  names: [
    { id: 2, name: 'Bram Osterfeld' },
    { id: 3, name: 'Cleo Marwick' },
    { id: 4, name: 'Dov Tallis' },
  ],
  consented: true,
  version: 0,
  nominations: [],
  savedAt: null,
  nobody: false,
  debriefReady: false,
};

describe('SurveyForm', () => {
  let fixture: ComponentFixture<SurveyForm>;
  let http: HttpTestingController;
  let el: HTMLElement;

  async function setUp(state: SurveyState = STATE) {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    fixture = TestBed.createComponent(SurveyForm);
    fixture.componentRef.setInput('token', 'T'.repeat(43));
    fixture.componentRef.setInput('state', state);
    http = TestBed.inject(HttpTestingController);
    el = fixture.nativeElement;
    await fixture.whenStable();
  }

  const nameButton = (name: string) =>
    [...el.querySelectorAll<HTMLButtonElement>('button.name')].find((b) => b.textContent!.includes(name))!;
  const send = () => el.querySelector<HTMLButtonElement>('button.send')!;

  afterEach(() => http.verify());

  it('picks a name with a default level, lets the level change, and sends the answers with the loaded version', async () => {
    await setUp();
    nameButton('Cleo Marwick').click();
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=pick-counter]')!.textContent).toContain('1 of at most 2');
    const often = [...el.querySelectorAll<HTMLLabelElement>('label.level')].find((l) => l.textContent!.includes('Most days'))!;
    often.querySelector('input')!.click();
    await fixture.whenStable();
    send().click();
    const req = http.expectOne('/api/p/' + 'T'.repeat(43) + '/answers');
    expect(req.request.method).toBe('PUT');
    expect(req.request.body).toEqual({ version: 0, nominations: [{ participantId: 3, level: 'often' }] });
    req.flush({ ...STATE, version: 1, nominations: [{ participantId: 3, level: 'often' }], savedAt: '2026-05-14T09:00:00Z' });
    await fixture.whenStable();
    expect(el.textContent).toContain('your answers are saved');
  });

  it('refuses an empty answer and sends the explicit “nobody” choice instead', async () => {
    await setUp();
    send().click();
    await fixture.whenStable();
    http.expectNone('/api/p/' + 'T'.repeat(43) + '/answers');
    expect(el.textContent).toContain('Pick at least one person you ask, or choose “I talk to nobody here regularly”');
    const nobody = [...el.querySelectorAll<HTMLButtonElement>('button.name')].find((b) => b.textContent!.includes('nobody here'))!;
    nameButton('Bram Osterfeld').click();
    nobody.click();
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=pick-counter]')!.textContent).toContain('0 of at most 2');
    send().click();
    const req = http.expectOne('/api/p/' + 'T'.repeat(43) + '/answers');
    expect(req.request.body).toEqual({ version: 0, nominations: [], nobody: true });
    req.flush({ ...STATE, version: 1, savedAt: '2026-05-14T09:00:00Z', nobody: true });
    await fixture.whenStable();
    expect(el.textContent).toContain('your answers are saved');
  });

  it('stops at the facilitator’s limit with a message saying how many to untick', async () => {
    await setUp();
    for (const n of ['Bram Osterfeld', 'Cleo Marwick', 'Dov Tallis']) nameButton(n).click();
    await fixture.whenStable();
    expect(el.textContent).toContain('You picked 3; this survey asks for at most 2. Untick 1');
    expect(send().disabled).toBeTrue();
    nameButton('Dov Tallis').click();
    await fixture.whenStable();
    expect(send().disabled).toBeFalse();
  });

  it('shows the answers saved in another browser and can send this page’s answers over them', async () => {
    await setUp();
    nameButton('Bram Osterfeld').click();
    await fixture.whenStable();
    send().click();
    http
      .expectOne(() => true)
      .flush(
        {
          error: {
            code: 'answers_changed',
            message: 'Your answers were changed in another browser or tab since you opened this page.',
            details: { version: 3, nominations: [{ participantId: 4, level: 'sometimes' }], savedAt: null },
          },
        },
        { status: 409, statusText: 'Conflict' },
      );
    await fixture.whenStable();
    expect(el.textContent).toContain('changed in another browser');
    expect(el.querySelector('.conflict-box')!.textContent).toContain('Dov Tallis · Now and then');
    [...el.querySelectorAll<HTMLButtonElement>('.conflict-box button')].find((b) => b.textContent!.includes('on this page'))!.click();
    const retry = http.expectOne(() => true);
    expect(retry.request.body).toEqual({ version: 3, nominations: [{ participantId: 2, level: 'weekly' }] });
    retry.flush({ ...STATE, version: 4, nominations: [{ participantId: 2, level: 'weekly' }] });
    await fixture.whenStable();
    expect(el.querySelector('.conflict-box')).toBeNull();
  });

  it('keeps the picks and shows the server’s reason when a save is refused', async () => {
    await setUp();
    nameButton('Bram Osterfeld').click();
    await fixture.whenStable();
    send().click();
    http
      .expectOne(() => true)
      .flush(
        { error: { code: 'survey_closed', message: 'The survey has closed, so answers can no longer be changed.' } },
        { status: 409, statusText: 'Conflict' },
      );
    await fixture.whenStable();
    expect(el.textContent).toContain('The survey has closed');
    expect(nameButton('Bram Osterfeld').getAttribute('aria-pressed')).toBe('true');
  });

  it('shows saved answers read-only once the survey is closed', async () => {
    await setUp({ ...STATE, open: false, status: 'running', nominations: [{ participantId: 2, level: 'often' }] });
    expect(nameButton('Bram Osterfeld').disabled).toBeTrue();
    expect(nameButton('Bram Osterfeld').getAttribute('aria-pressed')).toBe('true');
    expect(el.querySelector('button.send')).toBeNull();
    expect(el.textContent).toContain('The survey is closed');
  });
});
