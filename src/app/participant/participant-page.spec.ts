import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { PLATFORM_ID, REQUEST_CONTEXT } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { SurveyState } from '../../../shared/api/workshops';
import ParticipantPage from './participant-page';

/** A participant's page as the server draws it: from the state it is handed, asking nothing. */
describe('ParticipantPage drawn on the server', () => {
  const token = 'a'.repeat(43);
  const state = {
    workshopTitle: 'Harbour tour briefing',
    sessionDate: '2026-04-21',
    facilitatorNames: ['Noor Valensky'],
    me: { id: 7, name: 'Mira Tollan' },
    status: 'collecting',
    open: true,
    nominationLimit: 3,
    names: [{ id: 8, name: 'Oskar Bruhn' }],
    consented: false,
    version: 0,
    nominations: [],
    savedAt: null,
    nobody: false,
    debriefReady: true,
  } as unknown as SurveyState;

  function draw(context: unknown) {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: PLATFORM_ID, useValue: 'server' },
        { provide: REQUEST_CONTEXT, useValue: context },
      ],
    });
    const fixture = TestBed.createComponent(ParticipantPage);
    fixture.componentRef.setInput('token', token);
    fixture.detectChanges();
    return fixture.nativeElement as HTMLElement;
  }

  it('greets the participant and shows the notice from the state it was handed, with no request (not even for released results)', () => {
    const page = draw({ path: `/p/${token}`, firstState: state });
    expect(page.querySelector('h1')?.textContent?.trim()).toBe('Hello, Mira Tollan');
    expect(page.textContent).toContain('Before you answer');
    expect(page.textContent).toContain('I have read this and want to answer');
    TestBed.inject(HttpTestingController).verify();
  });

  it('uses no state handed for another link (and still asks nothing)', () => {
    const page = draw({ path: `/p/${'b'.repeat(43)}`, firstState: state });
    expect(page.querySelector('h1')).toBeNull();
    expect(page.textContent).toContain('Opening your page');
    TestBed.inject(HttpTestingController).verify();
  });
});
