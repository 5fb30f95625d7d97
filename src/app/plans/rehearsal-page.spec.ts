import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { JobDto, PlanSummary, RehearsalStarted, RehearsalSummary, ServerLimits } from '../../../shared/api/plans';
import { planSummary } from './plan-fixtures.spec';
import { FakeEventSource, lastSource, useFakeEventSource } from './fake-event-source.spec';
import RehearsalPage from './rehearsal-page';

const plan = (id: number, name: string, over: Partial<PlanSummary> = {}): PlanSummary =>
  planSummary({ id, name, starters: [{ personId: 2, name: 'Marek', group: null, order: 1 }], ...over });

const PLANS = [
  plan(1, 'Early draft'),
  plan(2, 'Monday plan', { chosen: true }),
  plan(3, 'Still computing', { status: 'computing', jobId: 4 }),
];
const LIMITS: ServerLimits = { maxCascades: 10000, maxJobsPerUser: 2, workers: 1 };

function job(id: number, over: Partial<JobDto> = {}): JobDto {
  return {
    id,
    kind: 'rehearsal',
    status: 'running',
    progress: 0,
    queuePosition: null,
    message: null,
    planId: null,
    rehearsalId: 9,
    createdAt: '2026-11-30T09:20:00Z',
    startedAt: null,
    finishedAt: null,
    ...over,
  };
}

function rehearsal(over: Partial<RehearsalSummary> = {}): RehearsalSummary {
  return {
    id: 9,
    number: 1,
    planId: 2,
    planName: 'Monday plan',
    roomId: 5,
    status: 'queued',
    runs: 200,
    seed: 'studio-1',
    jobId: 31,
    progress: 0,
    queuePosition: 1,
    average: null,
    averageStderr: null,
    analyticAverage: null,
    capped: null,
    elapsedMs: null,
    verdict: null,
    rerunOf: null,
    message: null,
    createdBy: 'Owner',
    createdAt: '2026-11-30T09:20:00Z',
    finishedAt: null,
    ...over,
  };
}

describe('RehearsalPage', () => {
  let router: RouterTestingHarness;
  let http: HttpTestingController;
  let loader: HarnessLoader;
  useFakeEventSource();

  async function settle(): Promise<void> {
    for (let i = 0; i < 3; i++) {
      await new Promise((r) => setTimeout(r));
      await router.fixture.whenStable();
    }
  }

  /** The history list reloads after most steps; it stays empty here. */
  function answerHistory(): number {
    const pending = http.match((r) => r.url === '/api/rooms/5/rehearsals');
    for (const r of pending) r.flush([]);
    return pending.length;
  }

  async function open(url = '/rooms/5/plans/rehearsals'): Promise<void> {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([{ path: 'rooms/:roomId/plans/rehearsals', component: RehearsalPage }], withComponentInputBinding()),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    router = await RouterTestingHarness.create();
    const navigated = router.navigateByUrl(url);
    await settle();
    http.expectOne('/api/rooms/5/plans').flush(PLANS);
    http.expectOne('/api/jobs/limits').flush(LIMITS);
    answerHistory();
    await navigated;
    await settle();
    loader = TestbedHarnessEnvironment.loader(router.fixture);
  }

  const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  const input = async (label: string) => (await (await field(label)).getControl(MatInputHarness))!;
  const startButton = () => loader.getHarness(MatButtonHarness.with({ text: /Start rehearsal/ }));
  const text = () => ((router.routeNativeElement as HTMLElement).textContent ?? '').replace(/\s+/g, ' ');

  it('offers only the finished plans, picks the chosen one, and states the server cap under Cascades', async () => {
    await open();
    const select = (await (await field('Plan')).getControl(MatSelectHarness))!;
    expect(await select.getValueText()).toBe('Monday plan · chosen');
    await select.open();
    const options = await select.getOptions();
    expect(await Promise.all(options.map((o) => o.getText()))).toEqual(['Early draft', 'Monday plan · chosen']);
    expect(await (await field('Cascades')).getTextHints()).toEqual(['Up to 10,000 (server limit)']);
    expect(await (await input('Cascades')).getValue()).toBe('5000');
    expect(await (await startButton()).isDisabled()).toBeFalse();
  });

  it('refuses an out-of-range cascade count with the message under the field and a disabled submit', async () => {
    await open();
    const cascades = await input('Cascades');
    await cascades.setValue('20000');
    await cascades.blur();
    expect(await (await field('Cascades')).getTextErrors()).toEqual([
      'At most 10,000 cascades per rehearsal (you asked for 20,000): lower the number.',
    ]);
    expect(await (await startButton()).isDisabled()).toBeTrue();
    await cascades.setValue('0');
    expect(await (await field('Cascades')).getTextErrors()).toEqual(['Simulate at least 1 cascade (at most 10,000).']);
    expect(await (await startButton()).isDisabled()).toBeTrue();
    await cascades.setValue('200');
    expect(await (await field('Cascades')).getTextErrors()).toEqual([]);
    expect(await (await startButton()).isDisabled()).toBeFalse();
    expect(http.match({ method: 'POST' })).toEqual([]);
  });

  it('refuses a seed with a space, and the dice button gives a fresh valid one', async () => {
    await open();
    const seed = await input('Seed');
    await seed.setValue('all hands');
    await seed.blur();
    expect((await (await field('Seed')).getTextErrors())[0]).toContain('no spaces');
    expect(await (await startButton()).isDisabled()).toBeTrue();
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="New random seed"]' }))).click();
    expect(await seed.getValue()).toMatch(/^[a-z0-9]{10}$/);
    expect(await (await field('Seed')).getTextErrors()).toEqual([]);
    expect(await (await startButton()).isDisabled()).toBeFalse();
  });

  it('starts the rehearsal for the plan picked, then follows it with a determinate bar and cascade count', async () => {
    await open();
    const select = (await (await field('Plan')).getControl(MatSelectHarness))!;
    await select.open();
    await select.clickOptions({ text: 'Early draft' });
    await (await input('Cascades')).setValue('200');
    await (await input('Seed')).setValue('studio-1');
    await (await startButton()).click();
    const req = http.expectOne({ method: 'POST', url: '/api/plans/1/rehearsals' });
    expect(req.request.body).toEqual({ runs: 200, seed: 'studio-1', idempotencyKey: jasmine.any(String) });
    req.flush({
      rehearsal: rehearsal({ planId: 1 }),
      job: job(31, { status: 'queued', queuePosition: 1 }),
      reused: false,
    } satisfies RehearsalStarted);
    await settle();
    answerHistory();
    await settle();

    expect(FakeEventSource.opened.map((s) => s.url)).toEqual(['/api/rehearsals/9/events']);
    const bar = await loader.getHarness(MatProgressBarHarness);
    expect(await bar.getMode()).toBe('determinate');
    expect(text()).toContain('Waiting: number 1 in your queue.');
    expect(await (await startButton()).isDisabled())
      .withContext('one rehearsal at a time')
      .toBeTrue();
    lastSource().send({ type: 'progress', job: job(31, { progress: 0.25 }), fraction: 0.25, done: 50, of: 200 });
    await settle();
    expect(await bar.getValue()).toBe(25);
    expect(text()).toContain('25% · 50 of 200 cascades');
  });

  it('Cancel calls the cancel endpoint and the cancelled event says no result is shown', async () => {
    await open();
    await (await startButton()).click();
    http
      .expectOne({ method: 'POST', url: '/api/plans/2/rehearsals' })
      .flush({ rehearsal: rehearsal({ status: 'running', queuePosition: null }), job: job(31), reused: false } satisfies RehearsalStarted);
    await settle();
    answerHistory();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Cancel/ }))).click();
    http.expectOne({ method: 'POST', url: '/api/rehearsals/9/cancel' }).flush(rehearsal({ status: 'cancelled' }));
    lastSource().send({ type: 'cancelled', job: job(31, { status: 'cancelled' }) });
    await settle();
    answerHistory();
    await settle();
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toEqual([]);
    expect(text()).toContain('Rehearsal cancelled: nothing from it is shown as a result.');
    expect(await (await startButton()).isDisabled()).toBeFalse();
  });
});
