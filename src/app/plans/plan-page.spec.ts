import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { JobDto, PlanDetail, PlanStarted, PlanSummary } from '../../../shared/api/plans';
import type { RoomDto } from '../../../shared/api/rooms';
import { planDetail } from './plan-fixtures.spec';
import { FakeEventSource, lastSource, useFakeEventSource } from './fake-event-source.spec';
import PlanPage from './plan-page';
import { CUT_SHORT_SINCE_PROVEN } from './score-words';

const ROOM: RoomDto = {
  id: 5,
  name: 'Studio floor',
  description: '',
  settings: { directed: false, minutesPerHop: 10, laziness: 0, mixing: 0 },
  version: 3,
  access: 'owner',
  ownerName: 'Owner',
  people: ['Ines', 'Marek', 'Tove', 'Udo', 'Wren', 'Yara'].map((name, i) => ({
    id: i + 1,
    key: `k${i + 1}`,
    name,
    group: null,
    email: null,
    x: i * 40,
    y: 0,
    pinned: true,
  })),
  ties: [1, 2, 3, 4, 5].map((i) => ({ id: 100 + i, sourceId: i, targetId: i + 1, strength: 1 })),
  updatedAt: '2026-11-30T09:00:00Z',
};

function plan(id: number, over: Partial<PlanDetail> = {}): PlanDetail {
  return planDetail({
    id,
    name: `Plan ${id}`,
    lowerBound: 6,
    gap: 0,
    gapShare: 0,
    certified: true,
    optimumKnown: true,
    perPerson: ROOM.people.map((p) => ({
      personId: p.id,
      name: p.name,
      group: null,
      starter: p.id === 2 || p.id === 5,
      order: p.id === 2 ? 1 : p.id === 5 ? 2 : null,
      expectedHops: p.id === 2 || p.id === 5 ? 0 : 1.5,
      expectedMinutes: p.id === 2 || p.id === 5 ? 0 : 15,
    })),
    ...over,
  });
}

const summary = ({ perPerson: _p, reach: _r, ...s }: PlanDetail): PlanSummary => s;

function job(id: number, over: Partial<JobDto> = {}): JobDto {
  return {
    id,
    kind: 'plan',
    status: 'running',
    progress: 0,
    queuePosition: null,
    message: null,
    planId: 8,
    rehearsalId: null,
    createdAt: '2026-11-30T09:20:00Z',
    startedAt: '2026-11-30T09:20:00Z',
    finishedAt: null,
    ...over,
  };
}

describe('PlanPage', () => {
  let router: RouterTestingHarness;
  let http: HttpTestingController;
  let loader: HarnessLoader;
  useFakeEventSource();

  async function open(url: string, room: RoomDto = ROOM, saved: PlanDetail[] = []): Promise<void> {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([{ path: 'rooms/:roomId/plans', component: PlanPage }], withComponentInputBinding()),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    router = await RouterTestingHarness.create();
    const navigated = router.navigateByUrl(url);
    await settle();
    http.expectOne('/api/rooms/5').flush(room);
    for (const p of saved) {
      const shown = http.match(`/api/plans/${p.id}`);
      for (const r of shown) r.flush(p);
    }
    await settle();
    http.expectOne('/api/rooms/5/plans').flush(saved.map(summary));
    await navigated;
    await settle();
    loader = TestbedHarnessEnvironment.loader(router.fixture);
  }

  async function settle(): Promise<void> {
    for (let i = 0; i < 3; i++) {
      await new Promise((r) => setTimeout(r));
      await router.fixture.whenStable();
    }
  }

  const text = () => ((router.routeNativeElement as HTMLElement).textContent ?? '').replace(/\s+/g, ' ');
  const submit = () => loader.getHarness(MatButtonHarness.with({ ancestor: 'app-plan-form-panel', selector: '[type=submit]' }));
  const budget = () => loader.getHarness(MatInputHarness.with({ selector: '[formcontrolname=k]' }));
  const shownArea = () => (router.routeNativeElement as HTMLElement).querySelector<HTMLElement>('.shown')!;

  it('sends the budget from the form and shows the finished plan with its actions', async () => {
    await open('/rooms/5/plans');
    expect(text()).toContain('Studio floor: 6 people, 5 ties');
    expect(text()).toContain('Set a budget and press');
    await (await budget()).setValue('2');
    await (await submit()).click();
    const req = http.expectOne({ method: 'POST', url: '/api/rooms/5/plans' });
    expect(req.request.body).toEqual(jasmine.objectContaining({ k: 2, method: 'auto', mustBrief: [], cannotBrief: [] }));
    req.flush(plan(7));
    await settle();
    http.expectNone('/api/rooms/5/plans');
    expect((router.routeNativeElement as HTMLElement).querySelector('.result-head h2')?.textContent).toBe('Plan 7');
    expect(text()).toContain('Marek');
    const listed = [...(router.routeNativeElement as HTMLElement).querySelectorAll('app-saved-plans tbody button.link')];
    expect(listed.map((b) => b.textContent?.trim()))
      .withContext('the new plan is listed without asking again')
      .toEqual(['Plan 7']);
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: /Mark as chosen/ }))).isDisabled()).toBeFalse();
  });

  it('while a background plan runs: a determinate bar that follows the job, the old result greyed out and inert, submit disabled', async () => {
    await open('/rooms/5/plans?plan=7', ROOM, [plan(7)]);
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toEqual([]);
    await (await budget()).setValue('3');
    await (await submit()).click();
    const started: PlanStarted = { plan: summary(plan(8, { status: 'computing', jobId: 44, k: 3 })), job: job(44) };
    http.expectOne({ method: 'POST', url: '/api/rooms/5/plans' }).flush(started);
    await settle();
    http.expectNone('/api/rooms/5/plans');
    const rows = [...(router.routeNativeElement as HTMLElement).querySelectorAll('app-saved-plans tbody tr')];
    expect(rows.map((r) => r.querySelector('button.link')?.textContent?.trim())).toEqual(['Plan 8', 'Plan 7']);
    expect(rows[0]?.querySelector('.badge')?.textContent?.trim()).withContext('listed at once, as computing').toBe('computing');

    const bar = await loader.getHarness(MatProgressBarHarness);
    expect(await bar.getMode()).toBe('determinate');
    expect(await bar.getValue()).toBe(0);
    expect(FakeEventSource.opened.map((s) => s.url)).toEqual(['/api/jobs/44/events']);
    lastSource().send({
      type: 'progress',
      job: job(44, { progress: 0.4 }),
      fraction: 0.4,
      search: { stage: 'swap', closed: null, bestTotal: 9, lowerBound: 7, gapShare: 0.22, nodes: null },
    });
    await settle();
    expect(await bar.getValue()).toBe(40);
    expect(text()).toContain('Trying swaps');
    expect(text()).toContain('Best plan so far: 3.00 hops');

    const area = shownArea();
    expect(area.classList).toContain('busy');
    expect(area.hasAttribute('inert')).toBeTrue();
    expect(area.getAttribute('aria-busy')).toBe('true');
    expect(text()).toContain('The plan below is the previous result');
    expect(await (await submit()).isDisabled()).toBeTrue();
  });

  it('Cancel calls the job cancel endpoint; the cancelled event removes the bar and says so', async () => {
    await open('/rooms/5/plans?plan=7', ROOM, [plan(7)]);
    await (await submit()).click();
    http
      .expectOne({ method: 'POST', url: '/api/rooms/5/plans' })
      .flush({ plan: summary(plan(8, { status: 'computing', jobId: 45 })), job: job(45) } satisfies PlanStarted);
    await settle();

    await (await loader.getHarness(MatButtonHarness.with({ ancestor: 'app-plan-progress', text: /Cancel/ }))).click();
    const cancel = http.expectOne({ method: 'POST', url: '/api/jobs/45/cancel' });
    cancel.flush(job(45, { status: 'cancelled' }));
    lastSource().send({ type: 'cancelled', job: job(45, { status: 'cancelled' }) });
    await settle();
    http.expectOne('/api/rooms/5/plans').flush([summary(plan(7))]);
    await settle();

    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toEqual([]);
    expect(text()).toContain('The plan was cancelled.');
    expect(shownArea().classList).not.toContain('busy');
    expect(shownArea().hasAttribute('inert')).toBeFalse();
    expect(await (await submit()).isDisabled()).toBeFalse();
    expect(lastSource().readyState).withContext('the stream is closed').toBe(2);
  });

  it('when the job is done the new plan replaces the previous one', async () => {
    await open('/rooms/5/plans?plan=7', ROOM, [plan(7)]);
    await (await submit()).click();
    http
      .expectOne({ method: 'POST', url: '/api/rooms/5/plans' })
      .flush({ plan: summary(plan(8, { status: 'computing', jobId: 46 })), job: job(46) } satisfies PlanStarted);
    await settle();
    lastSource().send({ type: 'done', job: job(46, { status: 'done', progress: 1 }) });
    await settle();
    http.expectOne('/api/plans/8').flush(plan(8, { name: 'Quick plan' }));
    await settle();
    http.expectOne('/api/rooms/5/plans').flush([summary(plan(7)), summary(plan(8))]);
    await settle();
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toEqual([]);
    expect((router.routeNativeElement as HTMLElement).querySelector('.result-head h2')?.textContent).toBe('Quick plan');
    expect(text()).not.toContain('The plan below is the previous result');
  });

  it('marking a plan as chosen saves it and confirms it in a snack bar', async () => {
    await open('/rooms/5/plans?plan=7', ROOM, [plan(7)]);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Mark as chosen/ }))).click();
    const patch = http.expectOne({ method: 'PATCH', url: '/api/plans/7' });
    expect(patch.request.body).toEqual({ chosen: true });
    patch.flush(summary(plan(7, { chosen: true })));
    await settle();
    http.expectOne('/api/rooms/5/plans').flush([summary(plan(7, { chosen: true }))]);
    await settle();
    const snack = await TestbedHarnessEnvironment.documentRootLoader(router.fixture).getHarness(MatSnackBarHarness);
    expect(await snack.getMessage()).toBe('Plan 7 is now the chosen plan.');
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: /Chosen/ }))).isDisabled()).toBeFalse();
    expect(text()).toContain('chosen plan');
  });

  it('a viewer reads the plan but gets no form and cannot mark it as chosen', async () => {
    await open('/rooms/5/plans?plan=7', { ...ROOM, access: 'viewer' }, [plan(7, { certified: false, gap: 1, gapShare: 0.1 })]);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ ancestor: 'app-plan-form-panel' }))).toEqual([]);
    expect(text()).toContain('This room is shared with you to view.');
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: /Mark as chosen/ }))).isDisabled()).toBeTrue();
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Prove or improve/ }))).toEqual([]);
  });
  describe('a widened plan cut short by its time limit', () => {
    const cut = { code: 'widening-time-limit', text: 'Time limit reached after 3 of 10 seeds.' } as const;
    const note = { code: 'note', text: 'A warning of an older plan.' } as const;
    const widened = (certified: boolean) => plan(7, { methodUsed: 'widened', certified, warnings: [cut, note] });

    it('shows the time-limit warning while the plan is not proven best', async () => {
      await open('/rooms/5/plans?plan=7', ROOM, [widened(false)]);
      expect(text()).toContain(cut.text);
      expect(text()).toContain(note.text);
      expect(text()).not.toContain(CUT_SHORT_SINCE_PROVEN);
    });

    it('once a later search proved it best, says the stop no longer matters instead, and keeps the other warning', async () => {
      await open('/rooms/5/plans?plan=7', ROOM, [widened(true)]);
      expect(text()).not.toContain(cut.text);
      expect(text()).toContain(note.text);
      expect(text()).toContain(CUT_SHORT_SINCE_PROVEN);
    });
  });

  describe('proving in the background', () => {
    const proving = (over: Partial<PlanDetail> = {}) =>
      plan(7, {
        total: 8,
        average: 2,
        lowerBound: 6,
        gap: 2,
        gapShare: 0.25,
        certified: false,
        optimumKnown: false,
        proving: { jobId: 60, status: 'running', progress: 0.1 },
        searchSoFar: { nodes: 900, runs: 1, left: 0.6, finished: false },
        ...over,
      });
    const proofBar = () => loader.getHarness(MatProgressBarHarness.with({ selector: '[aria-label="Proving in the background"]' }));

    it('follows the proof live: a determinate bar and the gap shrinking, then proven best without a click', async () => {
      await open('/rooms/5/plans?plan=7', ROOM, [proving()]);
      expect(FakeEventSource.opened.map((s) => s.url)).toEqual(['/api/jobs/60/events']);
      const bar = await proofBar();
      expect(await bar.getMode()).toBe('determinate');
      expect(await bar.getValue()).toBe(10);
      expect(text()).toContain('Still proving in the background: this plan is at most 25% from the best possible.');
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Prove or improve|Keep proving/ }))).toEqual([]);
      expect(shownArea().hasAttribute('inert')).withContext('the plan stays usable while it is proven').toBeFalse();

      lastSource().send({
        type: 'progress',
        job: job(60, { kind: 'proof', progress: 0.5, planId: 7 }),
        fraction: 0.5,
        search: { stage: 'exhaustive', closed: 0.5, bestTotal: 8, lowerBound: 7, gapShare: 0.125, nodes: 5000 },
      });
      await settle();
      expect(await bar.getValue()).toBe(50);
      expect(text()).toContain('at most 12.5% from the best possible');

      lastSource().send({ type: 'done', job: job(60, { kind: 'proof', status: 'done', progress: 1, planId: 7 }) });
      await settle();
      http.expectOne('/api/plans/7').flush(
        proving({
          proving: null,
          lowerBound: 8,
          gap: 0,
          gapShare: 0,
          certified: true,
          searchSoFar: { nodes: 9000, runs: 2, left: 0, finished: true },
        }),
      );
      await settle();
      http.expectOne('/api/rooms/5/plans').flush([summary(plan(7))]);
      await settle();
      expect(await loader.getAllHarnesses(MatProgressBarHarness)).toEqual([]);
      expect(text()).toContain('Proven best: the background search checked every possible group of this size.');
      expect((router.routeNativeElement as HTMLElement).querySelector('.result-head h2')?.textContent).toBe('Plan 7');
    });

    it('offers the faster plan it found, and the shown plan stays as made', async () => {
      await open('/rooms/5/plans?plan=7', ROOM, [proving()]);
      lastSource().send({ type: 'done', job: job(60, { kind: 'proof', status: 'done', progress: 1, planId: 7 }) });
      await settle();
      http.expectOne('/api/plans/7').flush(proving({ proving: null, lowerBound: 7.5, gap: 0.5, gapShare: 0.0625, fasterPlanId: 9 }));
      await settle();
      http.expectOne('/api/rooms/5/plans').flush([summary(plan(7))]);
      await settle();
      expect(text()).toContain('A faster plan of this size was found in the background; this plan stays as you made it.');
      expect(text()).toContain('Marek');
      await (await loader.getHarness(MatButtonHarness.with({ text: /Open the faster plan/ }))).click();
      await settle();
      http.expectOne('/api/plans/9').flush(plan(9, { name: 'Plan 7 · faster, found in the background' }));
      await settle();
      expect((router.routeNativeElement as HTMLElement).querySelector('.result-head h2')?.textContent).toBe(
        'Plan 7 · faster, found in the background',
      );
    });

    it('Stop keeps what is proven; the stopped state says how much is left and offers Keep proving', async () => {
      await open('/rooms/5/plans?plan=7', ROOM, [proving()]);
      await (await loader.getHarness(MatButtonHarness.with({ text: /Stop, keep what is proven/ }))).click();
      const stop = http.expectOne({ method: 'POST', url: '/api/jobs/60/cancel' });
      expect(stop.request.body).toEqual({ keepBest: true });
      stop.flush(job(60, { kind: 'proof', planId: 7 }));
      lastSource().send({ type: 'done', job: job(60, { kind: 'proof', status: 'done', progress: 0.7, planId: 7 }) });
      await settle();
      http.expectOne('/api/plans/7').flush(
        proving({
          proving: null,
          lowerBound: 7,
          gap: 1,
          gapShare: 0.125,
          searchSoFar: { nodes: 4000, runs: 2, left: 0.3, finished: false },
        }),
      );
      await settle();
      http.expectOne('/api/rooms/5/plans').flush([summary(plan(7))]);
      await settle();
      expect(text()).toContain(
        'The background search stopped with this plan at most 12.5% from the best possible (30% of the possible groups still to check)',
      );
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Keep proving/ }))).toHaveSize(1);
    });
  });
});
