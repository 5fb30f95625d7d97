import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { startEarlyRequest } from '../core/early-request';
import { ReplayData } from './replay-data';

describe('ReplayData', () => {
  let http: HttpTestingController;
  let data: ReplayData;
  const bundle = { index: { rehearsalId: 5, samples: [] }, samples: [] };
  const answer =
    (body: unknown, status = 200) =>
    () =>
      Promise.resolve(new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } }));

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    data = TestBed.inject(ReplayData);
  });
  afterEach(() => http.verify());

  it('asks for everything in one request', async () => {
    const loaded = firstValueFrom(data.load('5'));
    http.expectOne('/api/rehearsals/5/replay').flush(bundle);
    expect(await loaded).toEqual(bundle as never);
  });

  it('uses the answer asked for as the app started, without asking again', async () => {
    startEarlyRequest('/replay/5', answer(bundle));
    expect(await firstValueFrom(data.load('5'))).toEqual(bundle as never);
    http.expectNone('/api/rehearsals/5/replay');
  });

  it('asks again through HttpClient when the early answer failed (its errors are handled as usual)', async () => {
    startEarlyRequest('/replay/5', answer({ error: { code: 'not_found' } }, 404));
    const loaded = firstValueFrom(data.load('5'));
    await new Promise((r) => setTimeout(r));
    http.expectOne('/api/rehearsals/5/replay').flush(bundle);
    expect(await loaded).toEqual(bundle as never);
  });
});
