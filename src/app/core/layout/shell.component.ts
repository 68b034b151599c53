import { ChangeDetectionStrategy, Component, DOCUMENT, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatToolbarModule } from '@angular/material/toolbar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { NavigationEnd, Router, RouterLink, RouterOutlet } from '@angular/router';
import { filter, firstValueFrom, map } from 'rxjs';
import { AuthApi } from '../api/auth.api';
import { NumberFormatStore } from '../format/number-format';
import { LoadingTracker } from '../http/loading.interceptor';
import { SessionStore } from '../session/session.store';
import { ThemeStore } from '../theme/theme.store';
import { SkipLinks, focusById } from './skip-links';
import { WorkspaceActions } from './workspace-actions';

/** The frame around every page: toolbar, progress bar, and the routed page. */
@Component({
  selector: 'cw-shell',
  imports: [
    RouterOutlet,
    RouterLink,
    MatToolbarModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatDividerModule,
    MatSelectModule,
    MatTooltipModule,
    MatProgressBarModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './shell.component.html',
  styleUrl: './shell.component.scss',
})
export class ShellComponent {
  protected readonly session = inject(SessionStore);
  protected readonly theme = inject(ThemeStore);
  protected readonly loading = inject(LoadingTracker);
  private readonly auth = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly workspaces = inject(WorkspaceActions);
  private readonly page = inject(DOCUMENT);
  protected readonly skipLinks = inject(SkipLinks);
  /** Created with the frame, so the user's number format applies on every page. */
  private readonly numberFormat = inject(NumberFormatStore);

  private readonly url = toSignal(
    this.router.events.pipe(
      filter((event) => event instanceof NavigationEnd),
      map((event) => event.urlAfterRedirects),
    ),
    { initialValue: this.router.url },
  );
  /** On the sign-in and registration pages the toolbar needs no "Sign in" link. */
  protected readonly onAuthPage = computed(() => /^\/(sign-in|register)\b/.test(this.url()));

  protected readonly homeLink = computed(() => {
    const id = this.session.homeWorkspaceId();
    return id ? ['/w', id, 'chains'] : ['/'];
  });

  protected skipTo(event: Event, targetId: string): void {
    if (focusById(this.page, targetId)) event.preventDefault();
  }

  protected openWorkspace(workspaceId: string): void {
    void this.router.navigate(['/w', workspaceId, 'chains']);
  }

  protected newWorkspace(): void {
    void this.workspaces.createWithDialog();
  }

  protected async signOut(): Promise<void> {
    try {
      await firstValueFrom(this.auth.logout());
    } finally {
      // Forget locally even if the server call failed: the user asked to leave.
      this.session.forget();
      await this.router.navigate(['/sign-in']);
    }
  }
}
