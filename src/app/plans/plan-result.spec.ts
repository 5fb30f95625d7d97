import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideCharts, withDefaultRegisterables } from 'ng2-charts';
import type { PlanDetail } from '../../../shared/api/plans';
import { planDetail } from './plan-fixtures.spec';
import type { RoomDto } from '../../../shared/api/rooms';
import { PlanResult } from './plan-result';

const names = ['Ines', 'Marek', 'Tove', 'Udo'];

const ROOM: RoomDto = {
  id: 5,
  name: 'Studio floor',
  description: '',
  settings: { directed: false, minutesPerHop: 10, laziness: 0, mixing: 0 },
  version: 1,
  access: 'owner',
  ownerName: 'Owner',
  people: names.map((name, i) => ({ id: i + 1, key: `k${i + 1}`, name, group: null, email: null, x: i * 40, y: 0, pinned: true })),
  ties: [1, 2, 3].map((i) => ({ id: 100 + i, sourceId: i, targetId: i + 1, strength: 1 })),
  updatedAt: '2026-11-30T09:00:00Z',
};

/** A finished plan of the path room briefing one person (hops are made up: only what is shown matters here). */
function plan(id: number, starter: number): PlanDetail {
  const hops = (p: number) => (p === starter ? 0 : Math.abs(p - starter) * 2);
  return planDetail({
    id,
    name: `Plan ${id}`,
    k: 1,
    methodUsed: 'swap',
    starters: [{ personId: starter, name: names[starter - 1]!, group: null, order: 1 }],
    total: 8,
    average: 8 / 3,
    averageMinutes: 80 / 3,
    qualityRank: 0.5,
    lowerBound: 8,
    gap: 0,
    gapShare: 0,
    certified: true,
    boundSource: 'search',
    bestKnownTotal: 8,
    optimumKnown: true,
    elapsedMs: 3,
    people: 4,
    roomVersion: 1,
    currentRoomVersion: 1,
    settings: ROOM.settings,
    perPerson: ROOM.people.map((p) => ({
      personId: p.id,
      name: p.name,
      group: null,
      starter: p.id === starter,
      order: p.id === starter ? 1 : null,
      expectedHops: hops(p.id),
      expectedMinutes: 10 * hops(p.id),
    })),
    reach: {
      byHop: [0, 0.5, 1],
      roomByHop: [0.25, 0.6, 1],
      byMinute: [],
      minutesPerHop: 10,
      complete: true,
      quantiles: [{ share: 0.9, hop: 2, minutes: 20 }],
    },
  });
}

describe('PlanResult', () => {
  let fixture: ComponentFixture<PlanResult>;
  const el = () => fixture.nativeElement as HTMLElement;
  const starters = () => [...el().querySelectorAll('.starters .starter')].map((s) => s.textContent?.replace(/\s+/g, ' ').trim());
  const mapStarter = () => el().querySelector('app-plan-map g.person.starter title')?.textContent;
  const firstRow = () => el().querySelector('app-plan-people-table tr.is-starter td')?.textContent?.trim();
  const dimmed = () => el().querySelectorAll('section.stale').length;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideCharts(withDefaultRegisterables()), { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
    });
    fixture = TestBed.createComponent(PlanResult);
    fixture.componentRef.setInput('room', ROOM);
  });

  it('shows the starters and scores at once, then the map, the reach curve and the table in later frames', async () => {
    fixture.componentRef.setInput('plan', plan(7, 2));
    fixture.detectChanges();
    expect(starters()).toEqual(['1 Marek']);
    expect(el().querySelector('app-plan-scores')).not.toBeNull();
    expect(el().querySelector('app-plan-map')).withContext('the map comes after the first frame').toBeNull();
    expect(el().querySelector('app-reach-chart')).toBeNull();
    expect(el().querySelector('app-plan-people-table')).toBeNull();
    expect(el().querySelectorAll('[aria-busy="true"]').length).withContext('space kept for the map and the curve').toBe(2);

    await fixture.whenStable();
    expect(mapStarter()).toBe('Marek: starter 1');
    expect(el().querySelector('app-reach-chart canvas')).not.toBeNull();
    expect(firstRow()).toBe('Marek');
    expect(el().querySelectorAll('[aria-busy="true"]').length).toBe(0);
    expect(dimmed()).toBe(0);
  });

  it('a new plan: its starters at once while the previous drawings stay, dimmed, until they are redrawn for it', async () => {
    fixture.componentRef.setInput('plan', plan(7, 2));
    await fixture.whenStable();
    fixture.componentRef.setInput('plan', plan(8, 4));
    fixture.detectChanges();
    expect(starters()).toEqual(['1 Udo']);
    expect(mapStarter()).withContext('the previous map until the new one is drawn').toBe('Marek: starter 1');
    expect(dimmed()).toBe(3);

    await fixture.whenStable();
    expect(mapStarter()).toBe('Udo: starter 1');
    expect(firstRow()).toBe('Udo');
    expect(dimmed()).toBe(0);
  });
});
