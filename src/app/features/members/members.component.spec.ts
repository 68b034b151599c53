import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { InvitationDto, MemberDto, WorkspaceRole } from '../../../../shared/schema/api';
import { CsrfTokenStore } from '../../core/http/csrf-token.store';
import { SessionStore } from '../../core/session/session.store';
import { provideAppIcons } from '../../core/theme/icons';
import MembersComponent from './members.component';

describe('MembersComponent', () => {
  let fixture: ComponentFixture<MembersComponent>;
  let http: HttpTestingController;
  let el: HTMLElement;

  afterEach(() => http.verify());

  it('should list the members for everyone', async () => {
    await setUp('viewer');
    expect(el.querySelectorAll('tr.mat-mdc-row').length).toBe(2);
    expect(el.textContent).toContain('grace@example.org');
  });

  it('should give a viewer or editor no way to change the list', async () => {
    await setUp('editor');
    expect(el.textContent).toContain('Only owners of this workspace can invite or remove members');
    expect(el.querySelector('mat-select')).toBeNull();
    expect(el.querySelector('button[aria-label^="Remove"]')).toBeNull();
    expect(el.querySelector('form')).toBeNull();
  });

  it('should let an owner invite by e-mail with a role, and list the invitation', async () => {
    await setUp('owner');
    const email = el.querySelector<HTMLInputElement>('form input[type="email"]')!;
    email.value = 'linus@example.org';
    email.dispatchEvent(new Event('input'));
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
    const invite = http.expectOne({ method: 'POST', url: '/api/workspaces/w1/invitations' });
    expect(invite.request.body).toEqual({ email: 'linus@example.org', role: 'editor' });
    invite.flush({ ...INVITATION, mail: { sent: true, outboxId: 'm1' } });
    await settle();
    http.expectOne('/api/workspaces/w1/invitations').flush([INVITATION]);
    await settle();
    await fixture.whenStable();
    expect(el.textContent).toContain('Invitation sent to linus@example.org.');
    expect(el.querySelector('ul[aria-label="Open invitations"]')?.textContent).toContain(
      'linus@example.org',
    );
    // The emptied address field is ready for the next one, not shown in red as a mistake.
    expect(email.value).toBe('');
    expect(el.querySelector('form mat-error')).toBeNull();
    expect(el.querySelector('form .mat-form-field-invalid')).toBeNull();
  });

  it('should say when the invitation mail did not go, keeping the invitation', async () => {
    await setUp('owner');
    const email = el.querySelector<HTMLInputElement>('form input[type="email"]')!;
    email.value = 'linus@example.org';
    email.dispatchEvent(new Event('input'));
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
    http.expectOne({ method: 'POST', url: '/api/workspaces/w1/invitations' }).flush({
      ...INVITATION,
      mail: {
        sent: false,
        outboxId: 'm1',
        message:
          'the mail to linus@example.org could not be sent yet (timeout); it is kept and retried automatically',
      },
    });
    await settle();
    http.expectOne('/api/workspaces/w1/invitations').flush([INVITATION]);
    await settle();
    await fixture.whenStable();
    expect(el.textContent).toContain('it is kept and retried automatically');
  });

  it("should refuse a malformed address with the schema's message", async () => {
    await setUp('owner');
    const email = el.querySelector<HTMLInputElement>('form input[type="email"]')!;
    email.value = 'linus@';
    email.dispatchEvent(new Event('input'));
    el.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
    expect(el.textContent).toContain('Enter a valid e-mail address.');
    http.expectNone({ method: 'POST', url: '/api/workspaces/w1/invitations' });
  });

  // Helpers
  async function setUp(role: WorkspaceRole): Promise<void> {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppIcons(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    TestBed.inject(CsrfTokenStore).set('tok');
    const session = TestBed.inject(SessionStore);
    const loaded = session.ensureLoaded();
    http.expectOne('/api/me').flush({
      user: { id: 'u1', email: 'ada@example.org', displayName: 'Ada', siteRole: 'user' },
      memberships: [{ workspaceId: 'w1', workspaceName: 'Lab', role }],
    });
    await loaded;
    session.setCurrentWorkspace('w1');
    fixture = TestBed.createComponent(MembersComponent);
    fixture.componentRef.setInput('workspaceId', 'w1');
    el = fixture.nativeElement;
    await fixture.whenStable();
    http.expectOne('/api/workspaces/w1/members').flush([...MEMBERS]);
    if (role === 'owner') http.expectOne('/api/workspaces/w1/invitations').flush([]);
    await settle();
    await fixture.whenStable();
  }
});

const INVITATION: InvitationDto = {
  id: 'i1',
  email: 'linus@example.org',
  role: 'editor',
  invitedBy: 'Ada',
  createdAt: '2026-12-02T05:00:00.000Z',
  expiresAt: '2026-12-09T05:00:00.000Z',
};

const MEMBERS: MemberDto[] = [
  { userId: 'u1', email: 'ada@example.org', displayName: 'Ada', role: 'owner' },
  { userId: 'u2', email: 'grace@example.org', displayName: 'Grace', role: 'viewer' },
];

function settle(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}
