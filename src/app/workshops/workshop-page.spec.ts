import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatRadioGroupHarness } from '@angular/material/radio/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { provideRouter } from '@angular/router';
import type { IssuedLink, ParticipantRow, SurveyProgress, WorkshopDetail } from '../../../shared/api/workshops';
import WorkshopPage from './workshop-page';

function participant(id: number, name: string, email: string | null): ParticipantRow {
  return {
    id,
    name,
    email,
    personId: null,
    claimed: false,
    answered: id === 1,
    answeredAt: id === 1 ? '2026-11-30T10:00:00Z' : null,
    activeLinks: 1,
    lastLinkUse: null,
    linkExpiresAt: '2026-12-30T10:00:00Z',
  };
}

const PEOPLE = [participant(1, 'Ines', 'ines@example.test'), participant(2, 'Marek', null), participant(3, 'Tove', 'tove@example.test')];

function workshop(over: Partial<WorkshopDetail> = {}): WorkshopDetail {
  return {
    id: 3,
    title: 'Spring kick-off',
    sessionDate: '2026-12-10',
    status: 'collecting',
    roomId: null,
    roomName: null,
    owner: true,
    nominationLimit: 5,
    linkDays: 30,
    showStarters: false,
    facilitators: [{ id: 1, name: 'Owner', email: 'owner@example.test', owner: true }],
    participants: PEOPLE,
    nextStatuses: ['running', 'closed'],
    debrief: null,
    joinCodeActive: false,
    ...over,
  };
}

const progressOf = (w: WorkshopDetail): SurveyProgress => ({
  status: w.status,
  participants: w.participants.length,
  answered: w.participants.filter((p) => p.answered).length,
  consented: 1,
  updatedAt: null,
});

describe('WorkshopPage', () => {
  let fixture: ComponentFixture<WorkshopPage>;
  let http: HttpTestingController;
  let loader: HarnessLoader;
  let root: HarnessLoader;
  let current: WorkshopDetail;

  async function settle(): Promise<void> {
    for (let i = 0; i < 3; i++) {
      await new Promise((r) => setTimeout(r));
      await fixture.whenStable();
    }
  }

  /** Answers the reads the page repeats after each change (detail, live count, missing answers). */
  async function answerReads(): Promise<void> {
    await settle();
    for (const r of http.match('/api/workshops/3')) r.flush(current);
    for (const r of http.match('/api/workshops/3/progress')) r.flush(progressOf(current));
    for (const r of http.match((q) => q.url.startsWith('/api/workshops/3/missing'))) r.flush([]);
    await settle();
  }

  async function open(w: WorkshopDetail): Promise<void> {
    current = w;
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(WorkshopPage);
    fixture.componentRef.setInput('id', '3');
    await answerReads();
    loader = TestbedHarnessEnvironment.loader(fixture);
    root = TestbedHarnessEnvironment.documentRootLoader(fixture);
  }

  const button = (text: string | RegExp) => loader.getHarness(MatButtonHarness.with({ text }));
  /** A checkbox by its accessible name (the ticks in the participants table have no visible label). */
  async function checkbox(name: string): Promise<MatCheckboxHarness> {
    for (const c of await loader.getAllHarnesses(MatCheckboxHarness)) if ((await c.getAriaLabel()) === name) return c;
    throw new Error(`no checkbox named ${name}`);
  }
  const text = () => ((fixture.nativeElement as HTMLElement).textContent ?? '').replace(/\s+/g, ' ');

  it('with zero participants, "Build the room", "E-mail links" and "Print a sheet" are disabled and say why', async () => {
    await open(workshop({ participants: [] }));
    expect(await (await button(/E-mail links/)).isDisabled()).toBeTrue();
    expect(await (await button(/Print a sheet/)).isDisabled()).toBeTrue();
    expect(await (await button('Build the room')).isDisabled()).toBeTrue();
    expect(text()).toContain('Add participants below first.');
    expect(text()).toContain('Add participants and collect their answers first.');
    expect(await (await checkbox('Choose everyone')).isDisabled()).toBeTrue();
    expect(text()).toContain('0 of 0 answered');
  });

  it('with participants the same buttons work; e-mailing reports who got a link and who has no address', async () => {
    await open(workshop());
    expect(await (await button('Build the room')).isDisabled()).toBeFalse();
    const email = await button(/E-mail links/);
    expect(await email.isDisabled()).toBeFalse();
    await email.click();
    http
      .expectOne({ method: 'POST', url: '/api/workshops/3/links/email' })
      .flush({ sent: ['Ines', 'Tove'], withoutEmail: ['Marek'], failed: [] });
    await answerReads();
    const snack = await root.getHarness(MatSnackBarHarness);
    expect(await snack.getMessage()).toBe('Sent to 2. 1 without an address: print their links or use the QR code.');
  });

  it("reissuing one person's link asks first; Cancel changes nothing, confirming replaces only that link", async () => {
    await open(workshop());
    const reissueInes = () => loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Reissue the link of Ines"]' }));
    await (await reissueInes()).click();
    let dialog = await root.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe("Reissue Ines's link?");
    expect(await dialog.getContentText()).toContain('stops working at once');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    await settle();
    expect(await root.getAllHarnesses(MatDialogHarness)).toEqual([]);
    expect(http.match((r) => r.url.endsWith('/links/reissue'))).toEqual([]);

    await (await reissueInes()).click();
    dialog = await root.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Reissue the link' }))).click();
    await settle();
    const req = http.expectOne({ method: 'POST', url: '/api/workshops/3/links/reissue' });
    expect(req.request.body).toEqual({ participantIds: [1], confirm: true });
    const links: IssuedLink[] = [
      {
        participantId: 1,
        name: 'Ines',
        email: 'ines@example.test',
        url: 'https://ripplehall.test/s/abc',
        expiresAt: '2027-01-01T00:00:00Z',
        qr: 'data:image/svg+xml;base64,PHN2Zy8+',
      },
    ];
    req.flush(links);
    await answerReads();
    const snack = await root.getHarness(MatSnackBarHarness);
    expect(await snack.getMessage()).toBe('New link for Ines; the old ones no longer work.');
    expect(await snack.getActionDescription()).toBe('Print them');
  });

  it('ticking people shows "n chosen" and one confirmed reissue for all of them', async () => {
    await open(workshop());
    await (await checkbox('Choose Ines')).check();
    await (await checkbox('Choose Tove')).check();
    expect(text()).toContain('2 chosen');
    expect(await (await checkbox('Choose everyone')).isIndeterminate()).toBeTrue();
    await (await button(/Reissue their links/)).click();
    const dialog = await root.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Reissue links for 2 people?');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Reissue 2 links' }))).click();
    await settle();
    expect(http.expectOne({ method: 'POST', url: '/api/workshops/3/links/reissue' }).request.body).toEqual({
      participantIds: [1, 3],
      confirm: true,
    });
  });

  it('the build mode chosen in the radio group is the one the missing answers and the build use', async () => {
    await open(workshop());
    const modes = await loader.getHarness(MatRadioGroupHarness.with({ selector: '[aria-label="How to read the answers"]' }));
    expect(await modes.getCheckedValue()).toBe('either');
    await modes.checkRadioButton({ label: /Only mutual/ });
    const missing = http.expectOne('/api/workshops/3/missing?mode=reciprocated');
    missing.flush([{ participantId: 2, name: 'Marek', nominatedBy: 1, meaning: 'named by Ines; not yet answered' }]);
    await settle();
    expect(text()).toContain('No answer yet from 1');
    await (await button('Build the room')).click();
    const build = http.expectOne({ method: 'POST', url: '/api/workshops/3/build' });
    expect(build.request.body).toEqual({ mode: 'reciprocated' });
    current = workshop({ roomId: 12, roomName: 'Spring kick-off room' });
    build.flush({ roomId: 12, people: 3, ties: 2, mode: 'reciprocated', missing: [] });
    await answerReads();
    for (const r of http.match('/api/rooms/12/rehearsals')) r.flush([]);
    await settle();
    expect(text()).toContain('The room now has 3 people and 2 ties from the survey.');
    expect(await (await button('Update the room')).isDisabled()).toBeFalse();
  });

  it('closing the survey asks first and says how many have not answered', async () => {
    await open(workshop());
    await (await button('Close the survey and run')).click();
    const dialog = await root.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Close the survey and run?');
    expect(await dialog.getContentText()).toContain('2 of 3 have not answered yet.');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Close the survey' }))).click();
    await settle();
    const move = http.expectOne({ method: 'POST', url: '/api/workshops/3/status' });
    expect(move.request.body).toEqual({ to: 'running' });
    current = workshop({ status: 'running', nextStatuses: ['collecting', 'debrief', 'closed'] });
    move.flush(current);
    await answerReads();
    expect(await (await button('Reopen the survey')).isDisabled()).toBeFalse();
  });
});
