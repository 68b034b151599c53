import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { provideRouter, Router } from '@angular/router';
import { errorInterceptor } from '../../core/http/error.interceptor';
import { SessionStore } from '../../core/session/session.store';
import RegisterComponent from './register.component';
import SignInComponent from './sign-in.component';

describe('sign-in and registration pages', () => {
  let http: HttpTestingController;
  let snackBar: { open: jest.Mock };

  beforeEach(() => {
    snackBar = { open: jest.fn() };
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: snackBar },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  describe('SignInComponent', () => {
    let fixture: ComponentFixture<SignInComponent>;

    beforeEach(async () => {
      fixture = TestBed.createComponent(SignInComponent);
      http.expectOne('/api/auth/registration').flush({ openRegistration: false });
      await fixture.whenStable();
    });

    it('should not offer registration when the site has it closed', () => {
      expect(text(fixture)).not.toContain('Create an account');
    });

    it('should show the schema message for a malformed e-mail and send nothing', async () => {
      type(fixture, 'input[type="email"]', 'not-an-address');
      type(fixture, 'input[type="password"]', 'whatever-it-is');
      await submit(fixture);
      expect(text(fixture)).toContain('Enter a valid e-mail address.');
      http.expectNone('/api/auth/login');
    });

    it('should show a wrong password in the form, not in a snackbar', async () => {
      fill(fixture, 'ada@example.org', 'wrong-password');
      await submit(fixture);
      http
        .expectOne('/api/auth/login')
        .flush(
          { error: 'unauthorized', message: 'wrong e-mail or password' },
          { status: 401, statusText: 'Unauthorized' },
        );
      await settle();
      await fixture.whenStable();
      expect(fixture.nativeElement.querySelector('[role="alert"]').textContent).toContain(
        'Wrong e-mail or password.',
      );
      expect(snackBar.open).not.toHaveBeenCalled();
    });

    it('should start the session and go where the user was heading', async () => {
      const navigate = jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
      fixture.componentRef.setInput('next', '/w/w1/members');
      fill(fixture, 'ada@example.org', 'right-password');
      await submit(fixture);
      const login = http.expectOne('/api/auth/login');
      expect(login.request.body).toEqual({ email: 'ada@example.org', password: 'right-password' });
      login.flush({ user: USER, csrfToken: 'tok' });
      await settle();
      http.expectOne('/api/me').flush({ user: USER, memberships: [] });
      await fixture.whenStable();
      await settle();
      expect(TestBed.inject(SessionStore).signedIn()).toBe(true);
      expect(navigate).toHaveBeenCalledWith('/w/w1/members');
    });
  });

  describe('RegisterComponent', () => {
    it('should say registration is closed when the site says so up front', async () => {
      const fixture = TestBed.createComponent(RegisterComponent);
      http.expectOne('/api/auth/registration').flush({ openRegistration: false });
      await fixture.whenStable();
      expect(text(fixture)).toContain('Registration is closed on this site.');
      expect(fixture.nativeElement.querySelector('form')).toBeNull();
    });

    it('should ask to confirm the address by mail when the server answers 202', async () => {
      const fixture = TestBed.createComponent(RegisterComponent);
      http.expectOne('/api/auth/registration').flush({ openRegistration: true });
      await fixture.whenStable();
      type(fixture, 'input[autocomplete="name"]', 'Ada');
      type(fixture, 'input[type="email"]', 'ada@example.org');
      type(fixture, 'input[type="password"]', 'long-enough-password');
      await submit(fixture);
      http
        .expectOne('/api/auth/register')
        .flush(
          { pending: true, message: 'check your mail: open the link we sent' },
          { status: 202, statusText: 'Accepted' },
        );
      await settle();
      await fixture.whenStable();
      expect(text(fixture)).toContain('Check your mail: open the link we sent.');
      expect(fixture.nativeElement.querySelector('form')).toBeNull();
      http.expectNone('/api/me');
    });

    it('should switch to the closed message when the server refuses the account', async () => {
      const fixture = TestBed.createComponent(RegisterComponent);
      http.expectOne('/api/auth/registration').flush({ openRegistration: true });
      await fixture.whenStable();
      type(fixture, 'input[autocomplete="name"]', 'Ada');
      type(fixture, 'input[type="email"]', 'ada@example.org');
      type(fixture, 'input[type="password"]', 'long-enough-password');
      await submit(fixture);
      http
        .expectOne('/api/auth/register')
        .flush(
          { error: 'registration-closed', message: 'registration is closed on this site' },
          { status: 403, statusText: 'Forbidden' },
        );
      await settle();
      await fixture.whenStable();
      expect(text(fixture)).toContain('Registration is closed on this site.');
      expect(snackBar.open).not.toHaveBeenCalled();
    });
  });
});

// Helpers
const USER = { id: 'u1', email: 'ada@example.org', displayName: 'Ada', siteRole: 'user' as const };

function type(fixture: ComponentFixture<unknown>, selector: string, value: string): void {
  const input = fixture.nativeElement.querySelector(selector) as HTMLInputElement;
  input.value = value;
  input.dispatchEvent(new Event('input'));
}

function fill(fixture: ComponentFixture<unknown>, email: string, password: string): void {
  type(fixture, 'input[type="email"]', email);
  type(fixture, 'input[type="password"]', password);
}

async function submit(fixture: ComponentFixture<unknown>): Promise<void> {
  (fixture.nativeElement.querySelector('form') as HTMLFormElement).dispatchEvent(
    new Event('submit'),
  );
  await fixture.whenStable();
}

function text(fixture: ComponentFixture<unknown>): string {
  return (fixture.nativeElement as HTMLElement).textContent ?? '';
}

/** Lets the page's awaited request settle before the DOM is checked. */
function settle(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}
