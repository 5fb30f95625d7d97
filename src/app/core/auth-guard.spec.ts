import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { type ActivatedRouteSnapshot, provideRouter, Router, type RouterStateSnapshot, UrlTree } from '@angular/router';
import type { Observable } from 'rxjs';
import { roleGuard, signedInGuard, signedOutGuard } from './auth-guard';

describe('auth guards', () => {
  let http: HttpTestingController;
  const route = {} as ActivatedRouteSnapshot;
  const state = { url: '/rooms/7' } as RouterStateSnapshot;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  /** Runs a guard while answering its /api/auth/me call with `user`. */
  function run(guard: typeof signedInGuard, user: unknown): boolean | UrlTree | undefined {
    const result = TestBed.runInInjectionContext(() => guard(route, state)) as Observable<boolean | UrlTree>;
    let answer: boolean | UrlTree | undefined;
    result.subscribe((r) => (answer = r));
    http.expectOne('/api/auth/me').flush({ user });
    return answer;
  }
  const url = (r: boolean | UrlTree | undefined) => (r instanceof UrlTree ? TestBed.inject(Router).serializeUrl(r) : r);

  const facilitator = { id: 2, email: 'f@x.test', name: 'F', role: 'facilitator' };
  const admin = { id: 1, email: 'a@x.test', name: 'A', role: 'admin' };

  it('signedInGuard sends a signed-out visitor to sign-in and back afterwards', () => {
    expect(url(run(signedInGuard, null))).toBe('/sign-in?next=%2Frooms%2F7');
  });

  it('two checks while the first is in flight share one request', () => {
    const answers: unknown[] = [];
    TestBed.runInInjectionContext(() => signedInGuard(route, state) as Observable<boolean | UrlTree>).subscribe((r) => answers.push(r));
    TestBed.runInInjectionContext(() => signedInGuard(route, state) as Observable<boolean | UrlTree>).subscribe((r) => answers.push(r));
    http.expectOne('/api/auth/me').flush({ user: facilitator });
    expect(answers).toEqual([true, true]);
  });

  it('signedInGuard lets a signed-in account through', () => {
    expect(run(signedInGuard, facilitator)).toBeTrue();
  });

  it('roleGuard(admin) refuses a facilitator with the not-allowed page', () => {
    expect(url(run(roleGuard('admin'), facilitator))).toBe('/not-allowed');
  });

  it('roleGuard(admin) lets an admin through and sends the signed-out to sign-in', () => {
    expect(run(roleGuard('admin'), admin)).toBeTrue();
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    http = TestBed.inject(HttpTestingController);
    expect(url(run(roleGuard('admin'), null))).toBe('/sign-in?next=%2Frooms%2F7');
  });

  it('signedOutGuard sends a signed-in account home (admins to the console)', () => {
    expect(url(run(signedOutGuard, facilitator))).toBe('/rooms');
  });

  it('signedOutGuard shows the sign-in page to the signed-out', () => {
    expect(run(signedOutGuard, null)).toBeTrue();
  });
});
