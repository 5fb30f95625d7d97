import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import SignIn from './sign-in';

describe('SignIn form', () => {
  let fixture: ComponentFixture<SignIn>;
  let http: HttpTestingController;
  let el: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [SignIn], providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    fixture = TestBed.createComponent(SignIn);
    http = TestBed.inject(HttpTestingController);
    el = fixture.nativeElement;
    await fixture.whenStable();
  });
  afterEach(() => http.verify());

  const input = (type: string) => el.querySelector<HTMLInputElement>(`input[type=${type}]`)!;
  async function type(target: HTMLInputElement, value: string) {
    target.value = value;
    target.dispatchEvent(new Event('input'));
    target.dispatchEvent(new Event('blur'));
    await fixture.whenStable();
  }
  async function submit() {
    el.querySelector<HTMLButtonElement>('button[type=submit]')!.click();
    await fixture.whenStable();
  }
  /** Lets the sign-in promise chain finish after the fake answer, then renders. */
  async function settle() {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }
  const errors = () => [...el.querySelectorAll('mat-error')].map((e) => e.textContent!.trim());

  it('says what is missing and sends nothing when the form is empty', async () => {
    await submit();
    expect(errors()).toEqual(['Enter your e-mail address.', 'Enter your password.']);
    http.expectNone('/api/auth/sign-in');
  });

  it('flags an address that is not an e-mail', async () => {
    await type(input('email'), 'not-an-address');
    await submit();
    expect(errors()).toContain('This does not look like an e-mail address.');
    http.expectNone('/api/auth/sign-in');
  });

  it('sends a valid form and shows the server answer for a wrong password', async () => {
    await type(input('email'), 'someone@example.test');
    await type(input('password'), 'wrong-password');
    await submit();
    const req = http.expectOne('/api/auth/sign-in');
    expect(req.request.body).toEqual({ email: 'someone@example.test', password: 'wrong-password' });
    req.flush(
      { error: { code: 'wrong_credentials', message: 'That e-mail and password do not match an active account.' } },
      { status: 401, statusText: 'Unauthorized' },
    );
    await settle();
    expect(el.querySelector('[role=alert]')?.textContent?.trim()).toBe('That e-mail and password do not match an active account.');
  });

  it('goes to the admin console after an admin signs in', async () => {
    const navigate = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    await type(input('email'), 'admin@example.test');
    await type(input('password'), 'right-password');
    await submit();
    http.expectOne('/api/auth/sign-in').flush({ user: { id: 1, email: 'admin@example.test', name: 'A', role: 'admin' } });
    await settle();
    expect(navigate).toHaveBeenCalledWith('/admin');
  });

  it('stays on the form and says why when the server warns the session cookie will not be kept', async () => {
    const navigate = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    await type(input('email'), 'someone@example.test');
    await type(input('password'), 'right-password');
    await submit();
    const warning = 'Signed in, but your browser reached the server over plain http while PUBLIC_URL starts with https://.';
    http.expectOne('/api/auth/sign-in').flush({ user: { id: 2, email: 'someone@example.test', name: 'S', role: 'facilitator' }, warning });
    await settle();
    expect(navigate).not.toHaveBeenCalled();
    expect(el.querySelector('[role=alert]')?.textContent?.trim()).toBe(warning);
  });
});
