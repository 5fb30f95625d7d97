import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { SurveyProgress, WorkshopDetail } from '../../../shared/api/workshops';
import { WorkshopStore } from './workshop-store';

const DETAIL = { id: 3, title: 'Spring kick-off', roomId: 12, participants: [] } as unknown as WorkshopDetail;
const PROGRESS: SurveyProgress = { status: 'collecting', participants: 4, answered: 1, consented: 2, updatedAt: null };

describe('WorkshopStore', () => {
  let store: WorkshopStore;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [WorkshopStore, provideHttpClient(), provideHttpClientTesting()] });
    store = TestBed.inject(WorkshopStore);
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => {
    store.ngOnDestroy();
    http.verify();
  });

  it('opens with the detail, the count and the missing answers at once, then the rehearsals of its room', () => {
    jasmine.clock().install();
    try {
      store.open(3);
      http.expectOne('/api/workshops/3/progress').flush(PROGRESS);
      http.expectOne('/api/workshops/3/missing?mode=either').flush([]);
      http.expectNone('/api/rooms/12/rehearsals');
      http.expectOne('/api/workshops/3').flush(DETAIL);
      http.expectOne('/api/rooms/12/rehearsals').flush([]);
      expect(store.workshop()?.title).toBe('Spring kick-off');
      expect(store.progress()?.answered).toBe(1);
      jasmine.clock().tick(3000);
      http.expectOne('/api/workshops/3/progress').flush({ ...PROGRESS, answered: 2 });
      expect(store.progress()?.answered).toBe(2);
    } finally {
      jasmine.clock().uninstall();
    }
  });

  it('a failed poll keeps the last count and does not fail the reload', () => {
    store.progress.set(PROGRESS);
    let done = false;
    store.open(3);
    store.poll().subscribe({ complete: () => (done = true) });
    for (const r of http.match('/api/workshops/3/progress')) r.flush('down', { status: 503, statusText: 'Unavailable' });
    http.expectOne('/api/workshops/3/missing?mode=either').flush([]);
    http.expectOne('/api/workshops/3').flush({ ...DETAIL, roomId: null });
    expect(done).toBeTrue();
    expect(store.progress()).toEqual(PROGRESS);
    expect(store.workshop()?.roomId).toBeNull();
  });

  it('reads the missing answers for the mode chosen now', () => {
    store.open(3);
    http.expectOne('/api/workshops/3/progress').flush(PROGRESS);
    http.expectOne('/api/workshops/3/missing?mode=either').flush([]);
    http.expectOne('/api/workshops/3').flush({ ...DETAIL, roomId: null });
    store.mode.set('reciprocated');
    store.refreshCounts();
    http.expectOne('/api/workshops/3/progress').flush(PROGRESS);
    const missing = [{ participantId: 2, name: 'Marek', nominatedBy: 1, meaning: 'not yet answered' }];
    http.expectOne('/api/workshops/3/missing?mode=reciprocated').flush(missing);
    expect(store.missing()).toEqual(missing);
  });
});
