import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Busy, busyInterceptor } from './busy-interceptor';
import { requestFlags } from './request-flags';

describe('busyInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let busy: Busy;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(withInterceptors([busyInterceptor])), provideHttpClientTesting()] });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    busy = TestBed.inject(Busy);
  });
  afterEach(() => backend.verify());

  it('counts a request while it is in flight, and again after it failed', () => {
    http.get('/api/a').subscribe();
    http.get('/api/b').subscribe({ error: () => undefined });
    expect(busy.active()).toBe(2);
    backend.expectOne('/api/a').flush({});
    expect(busy.active()).toBe(1);
    backend.expectOne('/api/b').flush('no', { status: 500, statusText: 'Server Error' });
    expect(busy.active()).toBe(0);
  });

  it('leaves out a quiet request, and sends no header for the flag', () => {
    http.get('/api/jobs/1', { context: requestFlags({ quiet: true }) }).subscribe();
    expect(busy.active()).toBe(0);
    const req = backend.expectOne('/api/jobs/1');
    expect(req.request.headers.keys()).toEqual([]);
    req.flush({});
    expect(busy.active()).toBe(0);
  });
});
