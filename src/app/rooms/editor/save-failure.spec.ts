import type { ApiError } from '../../core/api-error';
import { BUSY_RETRY_MS, saveFailure } from './save-failure';

describe('saveFailure', () => {
  it('a 409 is a conflict with the server’s versions, or the held version when it sent none', () => {
    const details = { currentVersion: 9, yourVersion: 4, message: 'changed' };
    expect(saveFailure({ status: 409, code: 'stale_version', message: 'Changed elsewhere.', details }, 4)).toEqual({
      kind: 'conflict',
      conflict: details,
    });
    expect(saveFailure({ status: 409, code: 'stale_version', message: 'Changed elsewhere.' }, 4)).toEqual({
      kind: 'conflict',
      conflict: { currentVersion: 4, yourVersion: 4, message: 'Changed elsewhere.' },
    });
  });

  it('busy writing waits for Retry-After within 1 to 30 seconds, else the default', () => {
    const busy = (retryAfterSeconds?: number) =>
      saveFailure(
        { status: 429, code: 'busy_writing', message: 'Still saving.', ...(retryAfterSeconds === undefined ? {} : { retryAfterSeconds }) },
        1,
      );
    expect(busy(6)).toEqual({ kind: 'busy', waitMs: 6000, message: 'Still saving. Ripplehall will send it again in 6 seconds.' });
    expect(busy(0)).toEqual(jasmine.objectContaining({ waitMs: 1000 }));
    expect(busy(600)).toEqual(jasmine.objectContaining({ waitMs: 30_000 }));
    expect(busy()).toEqual(jasmine.objectContaining({ waitMs: BUSY_RETRY_MS }));
  });

  it('anything else is shown with the fields the server named; another 429 is not a busy resend', () => {
    const e: ApiError = {
      status: 400,
      code: 'bad_request',
      message: 'Check the edit.',
      details: { fields: [{ field: 'ops.0.name', message: 'Enter a name.' }] },
    };
    expect(saveFailure(e, 1)).toEqual({ kind: 'failed', message: 'Check the edit. (ops.0.name: Enter a name.)' });
    expect(saveFailure({ status: 429, code: 'rate_limited', message: 'Slow down.' }, 1)).toEqual({ kind: 'failed', message: 'Slow down.' });
  });
});
