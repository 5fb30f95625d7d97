import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Observable } from 'rxjs';
import { csrfRetryInterceptor } from './csrf-retry-interceptor';

/** What a request ended with: its answer, or the error it failed with. */
function outcome(request: Observable<unknown>): () => unknown {
  let last: unknown = 'no answer yet';
  request.subscribe({ next: (v) => (last = v), error: (e: unknown) => (last = e) });
  return () => last;
}

describe('csrfRetryInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(withInterceptors([csrfRetryInterceptor])), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
  });
  afterEach(() => backend.verify());

  it('sends a write once more after a stale-token refusal, and returns what the second answer says', () => {
    const done = outcome(http.post('/api/rooms', { name: 'A' }));
    backend.expectOne('/api/rooms').flush({ error: { code: 'csrf', message: 'expired' } }, { status: 403, statusText: 'Forbidden' });
    backend.expectOne('/api/rooms').flush({ id: 7 });
    expect(done()).toEqual({ id: 7 });
  });

  it('retries only once, and never for another 403', () => {
    const twice = outcome(http.post('/api/rooms', {}));
    backend.expectOne('/api/rooms').flush({ error: { code: 'csrf' } }, { status: 403, statusText: 'Forbidden' });
    backend.expectOne('/api/rooms').flush({ error: { code: 'csrf' } }, { status: 403, statusText: 'Forbidden' });
    expect((twice() as { status: number }).status).toBe(403);

    const other = outcome(http.post('/api/rooms/1/shares', {}));
    backend.expectOne('/api/rooms/1/shares').flush({ error: { code: 'forbidden' } }, { status: 403, statusText: 'Forbidden' });
    expect((other() as { status: number }).status).toBe(403);
  });
});
