import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import type { MeDto } from '../../../../shared/schema/api';
import { CsrfTokenStore } from '../http/csrf-token.store';
import { SessionStore } from '../session/session.store';
import { provideAppIcons } from '../theme/icons';
import { ShellComponent } from './shell.component';

describe('ShellComponent', () => {
  let fixture: ComponentFixture<ShellComponent>;
  let http: HttpTestingController;
  let el: HTMLElement;

  beforeEach(() => {
    localStorage.clear();
    document.documentElement.classList.remove('cw-dark');
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppIcons(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  describe('toolbar', () => {
    it('should show the product name and a sign-in link to a visitor', async () => {
      await render(null);
      expect(el.querySelector('.cw-brand')?.textContent).toContain('Chainwright');
      expect(el.querySelector('a[href="/sign-in"]')).not.toBeNull();
      expect(el.querySelector('mat-select')).toBeNull();
    });

    it('should list the workspaces of a signed-in user in the switcher', async () => {
      await render(me('user'));
      expect(el.querySelector('mat-select')).not.toBeNull();
      expect(el.querySelector('.cw-account-name')?.textContent).toContain('Ada');
    });
  });

  describe('account menu', () => {
    it('should offer site administration to an admin only', async () => {
      await render({ ...me('admin'), mailCatcher: true });
      const items = await menuItems();
      expect(items).toContain('Site administration');
      expect(items).toContain('Development mailbox');
    });

    it('should offer the development mailbox only while the mail catcher is in use', async () => {
      await render({ ...me('admin'), mailCatcher: false });
      const items = await menuItems();
      expect(items).toContain('Site administration');
      expect(items).not.toContain('Development mailbox');
      expect(items).toContain('Outgoing mail');
    });

    it('should not offer site administration to other users', async () => {
      await render(me('user'));
      const items = await menuItems();
      expect(items).toEqual(['Account', 'Members', 'Parts bin', 'Activity', 'Sign out']);
    });

    it('should sign out, forget the session and go to sign-in', async () => {
      await render(me('user'));
      const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
      TestBed.inject(CsrfTokenStore).set('tok');
      await menuItems();
      const signOut = [...document.querySelectorAll<HTMLElement>('.mat-mdc-menu-item')].find((b) =>
        b.textContent?.includes('Sign out'),
      )!;
      signOut.click();
      http.expectOne({ method: 'POST', url: '/api/auth/logout' }).flush(null, {
        status: 204,
        statusText: 'No Content',
      });
      await settle();
      expect(TestBed.inject(SessionStore).signedIn()).toBe(false);
      expect(navigate).toHaveBeenCalledWith(['/sign-in']);
    });
  });

  describe('theme switch', () => {
    it('should switch to dark and say what the button does next', async () => {
      await render(null);
      const button = el.querySelector<HTMLButtonElement>(
        '[aria-label="Switch to the dark theme"]',
      )!;
      button.click();
      await fixture.whenStable();
      expect(document.documentElement.classList.contains('cw-dark')).toBe(true);
      expect(el.querySelector('[aria-label="Switch to the light theme"]')).not.toBeNull();
    });
  });

  // Helpers
  async function render(body: MeDto | null): Promise<void> {
    const session = TestBed.inject(SessionStore);
    const loaded = session.ensureLoaded();
    const req = http.expectOne('/api/me');
    if (body) req.flush(body);
    else req.flush({ error: 'unauthorized', message: 'x' }, { status: 401, statusText: 'x' });
    await loaded;
    fixture = TestBed.createComponent(ShellComponent);
    el = fixture.nativeElement;
    await fixture.whenStable();
  }

  async function menuItems(): Promise<string[]> {
    el.querySelector<HTMLButtonElement>('.cw-account-button')!.click();
    await fixture.whenStable();
    return [...document.querySelectorAll('.mat-mdc-menu-item')].map((i) => i.textContent!.trim());
  }
});

function me(siteRole: 'admin' | 'user'): MeDto {
  return {
    user: { id: 'u1', email: 'ada@example.org', displayName: 'Ada', siteRole },
    memberships: [{ workspaceId: 'w1', workspaceName: 'Lab', role: 'owner' }],
  };
}

function settle(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}
