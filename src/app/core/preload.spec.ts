import { PLATFORM_ID } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { of } from 'rxjs';
import { FacilitatorPreload, REPLAY_PRELOAD_DELAY_MS } from './preload';

describe('FacilitatorPreload', () => {
  let strategy: FacilitatorPreload;
  beforeEach(() => (strategy = TestBed.inject(FacilitatorPreload)));
  const at = (path: string) => history.replaceState(null, '', path);
  let before: string;
  beforeEach(() => (before = location.pathname + location.search));
  afterEach(() => at(before));

  it('fetches other pages at once from a facilitator page', () => {
    at('/rooms');
    const load = jasmine.createSpy('load').and.returnValue(of(true));
    strategy.preload({ path: 'workshops' }, load).subscribe();
    expect(load).toHaveBeenCalledTimes(1);
  });

  it('waits before fetching on the projector replay, so its first frames have the main thread', () => {
    at('/replay/4');
    jasmine.clock().install();
    try {
      const load = jasmine.createSpy('load').and.returnValue(of(true));
      strategy.preload({ path: 'workshops' }, load).subscribe();
      jasmine.clock().tick(REPLAY_PRELOAD_DELAY_MS - 1);
      expect(load).not.toHaveBeenCalled();
      jasmine.clock().tick(1);
      expect(load).toHaveBeenCalledTimes(1);
    } finally {
      jasmine.clock().uninstall();
    }
  });

  it('fetches nothing for a participant page', () => {
    at('/p/abcdefghijklmnopqrstuvwxyz');
    const load = jasmine.createSpy('load').and.returnValue(of(true));
    strategy.preload({ path: 'workshops' }, load).subscribe();
    strategy.preload({ path: 'p/:token' }, load).subscribe();
    expect(load).not.toHaveBeenCalled();
  });

  it('preloads nothing while the page is drawn on the server', () => {
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [{ provide: PLATFORM_ID, useValue: 'server' }] });
    const load = jasmine.createSpy('load').and.returnValue(of(true));
    TestBed.inject(FacilitatorPreload).preload({ path: 'workshops' }, load).subscribe();
    expect(load).not.toHaveBeenCalled();
  });
});
