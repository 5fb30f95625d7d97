import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { ComponentHarness, TestKey } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideRouter } from '@angular/router';
import type { ReplayIndex, ReplaySample } from '../../../shared/api/plans';
import ReplayPage from './replay-page';

/**
 * The replay's own controls are plain buttons (no Material component has a harness for them), so
 * the spec reads them through a harness of its own, by their accessible names.
 */
class ReplayHarness extends ComponentHarness {
  static hostSelector = 'section.replay';

  private readonly reachedEl = this.locatorFor('[data-testid="reached"]');
  private readonly hopEl = this.locatorFor('[data-testid="hop"]');
  private readonly hopOfEl = this.locatorFor('.replay-hop span:last-child');
  private readonly justHeardEl = this.locatorFor('.just-heard');
  private readonly canvasEl = this.locatorFor('canvas');
  private readonly cascadeSelect = this.locatorFor('select[aria-label="Cascade to replay"]');
  private readonly alert = this.locatorForOptional('[role="alert"]');
  private readonly controls = this.locatorForAll('.replay-controls button');
  private readonly speedButtons = this.locatorForAll('[role="group"][aria-label="Speed"] button');

  async reached(): Promise<string> {
    return (await this.reachedEl()).text();
  }
  async hop(): Promise<string> {
    return (await this.hopEl()).text();
  }
  async lastHop(): Promise<string> {
    return (await this.hopOfEl()).text();
  }
  async justHeard(): Promise<string> {
    return (await this.justHeardEl()).text();
  }
  async canvasLabel(): Promise<string | null> {
    return (await this.canvasEl()).getAttribute('aria-label');
  }
  async errorText(): Promise<string | null> {
    return (await this.alert())?.text() ?? null;
  }
  /** The accessible names of the control buttons, in order. */
  async controlLabels(): Promise<(string | null)[]> {
    const buttons = await this.controls();
    return Promise.all(buttons.map(async (b) => (await b.getAttribute('aria-label')) ?? (await b.text())));
  }
  async press(label: string): Promise<void> {
    for (const b of await this.controls()) {
      if (((await b.getAttribute('aria-label')) ?? (await b.text())) === label) return b.click();
    }
    throw new Error(`no control named ${label}`);
  }
  async pressedSpeed(): Promise<string | null> {
    for (const b of await this.speedButtons()) if ((await b.getAttribute('aria-pressed')) === 'true') return b.text();
    return null;
  }
  async keys(...keys: (TestKey | string)[]): Promise<void> {
    await (await this.host()).sendKeys(...keys);
  }
  async pickCascade(index: number): Promise<void> {
    await (await this.cascadeSelect()).selectOptions(index);
  }
  async cascadeOptions(): Promise<string[]> {
    const options = await this.locatorForAll('select[aria-label="Cascade to replay"] option')();
    return Promise.all(options.map((o) => o.text()));
  }
}

const INDEX: ReplayIndex = {
  rehearsalId: 9,
  seed: 'studio-1',
  runs: 200,
  minutesPerHop: 10,
  starters: [1],
  people: ['Ines', 'Marek', 'Tove', 'Udo'].map((name, index) => ({
    index,
    personId: index + 1,
    name,
    group: null,
    x: index * 50,
    y: index % 2 ? 40 : 0,
    starter: index === 0,
  })),
  ties: [
    { source: 0, target: 1, strength: 1 },
    { source: 1, target: 2, strength: 1 },
    { source: 1, target: 3, strength: 1 },
  ],
  directed: false,
  samples: [
    { n: 0, run: 4 },
    { n: 1, run: 17 },
  ],
};

const chain = (person: number, path: number[]) => ({ person, path, hops: path.length - 1, truncated: false, capped: false });
const SAMPLES: ReplaySample[] = [
  {
    rehearsalId: 9,
    n: 0,
    run: 4,
    seed: 'studio-1',
    heardAt: [0, 1, 2, 2],
    chains: [chain(1, [1, 0]), chain(2, [2, 1, 0]), chain(3, [3, 1, 0])],
    lastHop: 2,
  },
  {
    rehearsalId: 9,
    n: 1,
    run: 17,
    seed: 'studio-1',
    heardAt: [0, 1, 2, 3],
    chains: [chain(1, [1, 0]), chain(2, [2, 1, 0]), chain(3, [3, 2, 1, 0])],
    lastHop: 3,
  },
];

describe('ReplayPage', () => {
  let fixture: ComponentFixture<ReplayPage>;
  let replay: ReplayHarness;

  async function settle(): Promise<void> {
    for (let i = 0; i < 3; i++) {
      await new Promise((r) => setTimeout(r));
      await fixture.whenStable();
    }
  }

  async function open(index: ReplayIndex = INDEX, samples: ReplaySample[] = SAMPLES): Promise<void> {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    const http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReplayPage);
    fixture.componentRef.setInput('rehearsalId', '9');
    document.body.append(fixture.nativeElement);
    await settle();
    // One request for everything: the first frame never waits for the index, then its samples.
    http.expectOne('/api/rehearsals/9/replay').flush({ index, samples });
    http.verify();
    await settle();
    replay = await TestbedHarnessEnvironment.loader(fixture).getHarness(ReplayHarness);
  }

  afterEach(() => (fixture?.nativeElement as HTMLElement | undefined)?.remove());

  it('labels every control and starts at hop 0 with only the starter reached', async () => {
    await open();
    expect(await replay.controlLabels()).toEqual(['Back one hop', 'Play', 'Forward one hop', '0.5×', '1×', '2×', '4×', 'Full screen']);
    expect(await replay.reached()).toBe('1');
    expect(await replay.hop()).toBe('Hop 0');
    expect(await replay.lastHop()).toBe('of 2');
    expect(await replay.justHeard()).toContain('The starters have been briefed');
    expect(await replay.canvasLabel()).toBe('1 of 4 people have heard by hop 0');
    expect(await replay.pressedSpeed()).toBe('1×');
  });

  it('forward and back step one hop at a time, move the counter and name who just heard', async () => {
    await open();
    await replay.press('Forward one hop');
    expect(await replay.hop()).toBe('Hop 1');
    expect(await replay.reached()).toBe('2');
    expect(await replay.justHeard()).toBe('Marek');
    await replay.press('Forward one hop');
    expect(await replay.hop()).toBe('Hop 2');
    expect(await replay.reached()).toBe('4');
    expect(await replay.justHeard()).toBe('Tove, Udo');
    await replay.press('Forward one hop');
    expect(await replay.hop())
      .withContext('stops at the last hop')
      .toBe('Hop 2');
    await replay.press('Back one hop');
    expect(await replay.hop()).toBe('Hop 1');
    expect(await replay.canvasLabel()).toBe('2 of 4 people have heard by hop 1');
  });

  it('Play becomes Pause, plays to the end at the chosen speed, then offers Play again', async () => {
    await open();
    await replay.press('4×');
    expect(await replay.pressedSpeed()).toBe('4×');
    await replay.press('Play');
    expect(await replay.controlLabels()).toContain('Pause');
    const until = Date.now() + 5000;
    while ((await replay.hop()) !== 'Hop 2' && Date.now() < until) await new Promise((r) => setTimeout(r, 50));
    await settle();
    expect(await replay.hop()).toBe('Hop 2');
    expect(await replay.reached()).toBe('4');
    expect(await replay.controlLabels()).toContain('Play');
  });

  it('Pause stops the counter where it is', async () => {
    await open();
    await replay.press('0.5×');
    await replay.press('Play');
    await new Promise((r) => setTimeout(r, 300));
    await replay.press('Pause');
    const hop = await replay.hop();
    const reached = await replay.reached();
    await new Promise((r) => setTimeout(r, 2200));
    await settle();
    expect(await replay.hop()).toBe(hop);
    expect(await replay.reached()).toBe(reached);
    expect(await replay.controlLabels()).toContain('Play');
  });

  it('keys: arrows step, End jumps to the last hop, Home back to the start', async () => {
    await open();
    await replay.keys(TestKey.RIGHT_ARROW);
    expect(await replay.hop()).toBe('Hop 1');
    await replay.keys(TestKey.END);
    expect(await replay.hop()).toBe('Hop 2');
    await replay.keys(TestKey.LEFT_ARROW);
    expect(await replay.hop()).toBe('Hop 1');
    await replay.keys(TestKey.HOME);
    expect(await replay.hop()).toBe('Hop 0');
  });

  it('another cascade starts again at hop 0 with its own length; a rehearsal without cascades says so', async () => {
    await open();
    expect(await replay.cascadeOptions()).toEqual(['1 of 2 (run 5)', '2 of 2 (run 18)']);
    await replay.press('Forward one hop');
    await replay.pickCascade(1);
    expect(await replay.hop()).toBe('Hop 0');
    expect(await replay.lastHop()).toBe('of 3');
    (fixture.nativeElement as HTMLElement).remove();
    TestBed.resetTestingModule();
    await open({ ...INDEX, samples: [] }, []);
    expect(await replay.errorText()).toContain('This rehearsal kept no cascades to replay.');
  });
});
