import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { ActivityDto } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { SessionStore } from '../../core/session/session.store';

/** What happened in the workspace lately: who created, saved, restored, shared, commented, invited. */
@Component({
  selector: 'cw-activity',
  imports: [RouterLink, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="cw-page">
      <h1>Activity in {{ session.currentMembership()?.workspaceName }}</h1>
      @if (entries().length === 0 && loaded()) {
        <p class="cw-muted">Nothing has happened here yet.</p>
      }
      <ol class="feed" aria-label="Activity, newest first">
        @for (a of entries(); track a.id) {
          <li data-testid="activity-entry">
            <time [attr.datetime]="a.createdAt">{{ when(a.createdAt) }}</time>
            <span class="text">
              <strong>{{ a.actor }}</strong>
              @if (a.link) {
                <a [routerLink]="a.link">{{ a.summary }}</a>
              } @else {
                {{ a.summary }}
              }
            </span>
          </li>
        }
      </ol>
      @if (more()) {
        <button mat-stroked-button type="button" (click)="loadMore()">Older entries</button>
      }
    </section>
  `,
  styles: `
    .feed {
      list-style: none;
      padding: 0;
      margin: 16px 0;
    }
    .feed li {
      display: grid;
      grid-template-columns: 150px 1fr;
      gap: 12px;
      padding: 8px 0;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }
    time {
      color: var(--mat-sys-on-surface-variant);
      font-variant-numeric: tabular-nums;
    }
    .text strong {
      margin-right: 6px;
    }
  `,
})
export default class ActivityComponent {
  private readonly api = inject(ColleaguesApi);
  protected readonly session = inject(SessionStore);
  /** From the route. */
  readonly workspaceId = input.required<string>();

  protected readonly entries = signal<ActivityDto[]>([]);
  protected readonly loaded = signal(false);
  protected readonly more = signal(false);

  constructor() {
    effect(() => void this.load(this.workspaceId()));
  }

  protected when(iso: string): string {
    return iso.slice(0, 16).replace('T', ' ') + ' UTC';
  }

  private async load(workspaceId: string): Promise<void> {
    const page = await firstValueFrom(this.api.activity(workspaceId));
    this.entries.set(page);
    this.more.set(page.length >= 50);
    this.loaded.set(true);
  }

  protected async loadMore(): Promise<void> {
    const last = this.entries().at(-1);
    if (!last) return;
    const page = await firstValueFrom(this.api.activity(this.workspaceId(), last.createdAt));
    this.entries.update((list) => [...list, ...page]);
    this.more.set(page.length >= 50);
  }
}
