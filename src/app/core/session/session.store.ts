import { HttpContext, HttpErrorResponse } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type {
  MeDto,
  MembershipDto,
  SignedInDto,
  WorkspaceRole,
} from '../../../../shared/schema/api';
import { AuthApi } from '../api/auth.api';
import { CsrfTokenStore } from '../http/csrf-token.store';
import { SKIP_ERROR_SNACKBAR } from '../http/http-context';
import { roleAtLeast } from './roles';

/**
 * Who is signed in, their workspaces, and which workspace the user is looking at.
 * State lives in private signals; components read the read-only views.
 */
@Injectable({ providedIn: 'root' })
export class SessionStore {
  private readonly auth = inject(AuthApi);
  private readonly csrf = inject(CsrfTokenStore);

  private readonly meState = signal<MeDto | null>(null);
  private readonly loadedState = signal(false);
  private readonly workspaceIdState = signal<string | null>(null);
  private loading: Promise<MeDto | null> | null = null;

  /** The signed-in user and memberships, or null when signed out. */
  readonly me = this.meState.asReadonly();
  /** Whether GET /api/me has answered at least once. */
  readonly loaded = this.loadedState.asReadonly();
  /** The workspace in the current route, if any. */
  readonly currentWorkspaceId = this.workspaceIdState.asReadonly();

  readonly user = computed(() => this.meState()?.user ?? null);
  readonly signedIn = computed(() => this.meState() !== null);
  readonly isAdmin = computed(() => this.meState()?.user.siteRole === 'admin');
  /** Site admins: whether the local development mail catcher is in use (its mailbox exists). */
  readonly mailCatcher = computed(() => this.isAdmin() && this.meState()?.mailCatcher === true);
  readonly memberships = computed<MembershipDto[]>(() => this.meState()?.memberships ?? []);
  readonly currentMembership = computed(() => {
    const id = this.workspaceIdState();
    return this.memberships().find((m) => m.workspaceId === id) ?? null;
  });
  /** The user's role in the current workspace, or null outside one. */
  readonly role = computed<WorkspaceRole | null>(() => this.currentMembership()?.role ?? null);
  readonly canEdit = computed(() => roleAtLeast(this.role(), 'editor'));
  readonly isOwner = computed(() => roleAtLeast(this.role(), 'owner'));

  /** Loads /api/me once; later calls reuse the answer. Resolves to null when signed out. */
  ensureLoaded(): Promise<MeDto | null> {
    if (this.loadedState()) return Promise.resolve(this.meState());
    return this.refresh();
  }

  /** Asks the server again who is signed in (after joining or creating a workspace). */
  refresh(): Promise<MeDto | null> {
    // 401 is the normal answer for a visitor: handle it here, no snackbar or redirect.
    const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [401]);
    this.loading ??= firstValueFrom(this.auth.me(context))
      .then(
        (me) => me,
        (error: unknown) => {
          if (error instanceof HttpErrorResponse && error.status === 401) return null;
          throw error;
        },
      )
      .then((me) => {
        this.meState.set(me);
        this.loadedState.set(true);
        return me;
      })
      .finally(() => (this.loading = null));
    return this.loading;
  }

  /** Takes over a new session from a sign-in or registration answer. */
  async startSession(answer: SignedInDto): Promise<MeDto | null> {
    this.csrf.set(answer.csrfToken);
    this.meState.set({ user: answer.user, memberships: [] });
    return this.refresh();
  }

  /** Forgets the session locally (after sign-out, or when the server says it ended). */
  forget(): void {
    this.meState.set(null);
    this.loadedState.set(true);
    this.workspaceIdState.set(null);
    this.csrf.clear();
  }

  setCurrentWorkspace(workspaceId: string | null): void {
    this.workspaceIdState.set(workspaceId);
  }

  membershipOf(workspaceId: string): MembershipDto | null {
    return this.memberships().find((m) => m.workspaceId === workspaceId) ?? null;
  }

  /** The first workspace to open after sign-in: the current one if any, else the first. */
  homeWorkspaceId(): string | null {
    return this.currentMembership()?.workspaceId ?? this.memberships()[0]?.workspaceId ?? null;
  }
}
