import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { csrfRetryInterceptor } from './csrf-retry-interceptor';

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

  it('sends a write once more after a stale-token refusal, and returns what the second answer says', async () => {
    const done = firstValueFrom(http.post('/api/rooms', { name: 'A' }));
    backend.expectOne('/api/rooms').flush({ error: { code: 'csrf', message: 'expired' } }, { status: 403, statusText: 'Forbidden' });
    backend.expectOne('/api/rooms').flush({ id: 7 });
    expect(await done).toEqual({ id: 7 });
  });

  it('retries only once, and never for another 403', async () => {
    const twice = firstValueFrom(http.post('/api/rooms', {})).catch((e: unknown) => e);
    backend.expectOne('/api/rooms').flush({ error: { code: 'csrf' } }, { status: 403, statusText: 'Forbidden' });
    backend.expectOne('/api/rooms').flush({ error: { code: 'csrf' } }, { status: 403, statusText: 'Forbidden' });
    expect(((await twice) as { status: number }).status).toBe(403);

    const other = firstValueFrom(http.post('/api/rooms/1/shares', {})).catch((e: unknown) => e);
    backend.expectOne('/api/rooms/1/shares').flush({ error: { code: 'forbidden' } }, { status: 403, statusText: 'Forbidden' });
    expect(((await other) as { status: number }).status).toBe(403);
  });
});
