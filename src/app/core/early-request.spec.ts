import { earlyApiFor, startEarlyRequest, takeEarlyAnswer } from './early-request';

describe('early page requests', () => {
  const json = (body: unknown, status = 200) =>
    Promise.resolve(new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json; charset=utf-8' } }));

  it('names the replay bundle for a replay address and nothing for other pages', () => {
    expect(earlyApiFor('/replay/42')).toBe('/api/rehearsals/42/replay');
    expect(earlyApiFor('/replay/42/extra')).toBeNull();
    expect(earlyApiFor('/replay/x')).toBeNull();
    expect(earlyApiFor('/rooms/3/plans')).toBeNull();
  });

  it('keeps a successful answer once, with the session cookie sent', async () => {
    const fetchFn = jasmine.createSpy('fetch').and.callFake(() => json({ index: { rehearsalId: 7 }, samples: [] }));
    startEarlyRequest('/replay/7', fetchFn);
    expect(fetchFn).toHaveBeenCalledOnceWith('/api/rehearsals/7/replay', jasmine.objectContaining({ credentials: 'same-origin' }));
    expect(await takeEarlyAnswer('/api/rehearsals/7/replay')).toEqual({ index: { rehearsalId: 7 }, samples: [] } as never);
    expect(takeEarlyAnswer('/api/rehearsals/7/replay')).toBeNull();
  });

  it('drops an error answer and a network fault (the page then asks as usual)', async () => {
    startEarlyRequest('/replay/8', () => json({ error: { code: 'unauthorized' } }, 401));
    expect(await takeEarlyAnswer('/api/rehearsals/8/replay')).toBeNull();
    startEarlyRequest('/replay/9', () => Promise.reject(new TypeError('offline')));
    expect(await takeEarlyAnswer('/api/rehearsals/9/replay')).toBeNull();
  });

  it('starts nothing for a page without an early request', () => {
    const fetchFn = jasmine.createSpy('fetch');
    startEarlyRequest('/rooms', fetchFn);
    expect(fetchFn).not.toHaveBeenCalled();
  });
});
