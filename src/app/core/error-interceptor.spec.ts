import { HttpClient, HttpContext, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { provideRouter, Router } from '@angular/router';
import type { ApiError } from './api-error';
import { Auth } from './auth';
import { errorInterceptor, HANDLES_ERRORS } from './error-interceptor';
import { ErrorSnack } from './error-snack';

@Component({ template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class NextPage {}

describe('errorInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let snack: jasmine.Spy;
  let navigate: jasmine.Spy;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        provideRouter([{ path: 'next', component: NextPage }]),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    snack = spyOn(TestBed.inject(MatSnackBar), 'open').and.callThrough();
    navigate = spyOn(TestBed.inject(Router), 'navigate').and.resolveTo(true);
  });
  afterEach(() => backend.verify());

  async function failWith(url: string, status: number, body: string | object, context?: HttpContext): Promise<ApiError> {
    const failed = new Promise<ApiError>((resolve, reject) =>
      http.get(url, { context }).subscribe({
        next: () => reject(new Error('the request should fail')),
        error: (e: ApiError) => resolve(e),
      }),
    );
    backend.expectOne(url).flush(body, { status, statusText: 'Error' });
    const e = await failed;
    // The snackbar's code is fetched on the first message: wait until it is shown.
    await TestBed.inject(ErrorSnack).settled();
    return e;
  }

  it("shows the server's own message in a snackbar and passes the error on", async () => {
    const e = await failWith('/api/rooms/1', 409, { error: { code: 'conflict', message: 'That room was changed by someone else.' } });
    expect(e.status).toBe(409);
    expect(e.code).toBe('conflict');
    expect(snack).toHaveBeenCalledWith('That room was changed by someone else.', 'Dismiss', jasmine.any(Object));
  });

  it('stays quiet when the caller shows the error itself', async () => {
    const e = await failWith(
      '/api/rooms',
      400,
      { error: { code: 'bad_request', message: 'name: Enter a name.' } },
      new HttpContext().set(HANDLES_ERRORS, true),
    );
    expect(e.message).toBe('name: Enter a name.');
    expect(snack).not.toHaveBeenCalled();
  });

  it('turns a 401 into the sign-in page and forgets the account', async () => {
    const auth = TestBed.inject(Auth);
    const marked = spyOn(auth, 'markSignedOut').and.callThrough();
    await failWith('/api/rooms', 401, { error: { code: 'unauthorized', message: 'Please sign in first.' } });
    expect(marked).toHaveBeenCalled();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], jasmine.objectContaining({ queryParams: jasmine.any(Object) }));
    await navigate.calls.mostRecent().returnValue;
    await Promise.resolve();
    await TestBed.inject(ErrorSnack).settled();
    expect(snack.calls.mostRecent().args[0]).toContain('session has ended');
  });

  it('does not redirect on a 401 from the sign-in call itself (wrong password)', async () => {
    await failWith('/api/auth/sign-in', 401, { error: { code: 'wrong_credentials', message: 'No match.' } });
    expect(navigate).not.toHaveBeenCalled();
  });

  it('closes an error snackbar when the person moves to another page', async () => {
    navigate.and.callThrough();
    await failWith('/api/rooms/1', 409, { error: { code: 'conflict', message: 'That room was changed by someone else.' } });
    const ref = snack.calls.mostRecent().returnValue;
    const dismiss = spyOn(ref, 'dismiss').and.callThrough();
    await TestBed.inject(Router).navigateByUrl('/next');
    expect(dismiss).toHaveBeenCalled();
  });

  it('explains a server without a JSON error body', async () => {
    const e = await failWith('/api/x', 502, 'Bad Gateway');
    expect(e.message).toBe('The server answered 502 Error.');
  });
});
