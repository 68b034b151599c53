import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { RevisionSummaryDto } from '../../../../../shared/schema/api';
import { ChainsApi } from '../../../core/api/chains.api';
import { describeHttpError } from '../../../core/http/error-message';

/** Every saved version of the chain, newest first: view one read-only, or restore it. */
@Component({
  selector: 'cw-revision-panel',
  imports: [DatePipe, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 class="title">Revisions</h2>
    @if (error(); as message) {
      <p class="cw-error-text" role="alert">{{ message }}</p>
    }
    <ol class="list">
      @for (r of revisions(); track r.id) {
        <li [class.current]="r.version === currentVersion()" [attr.data-version]="r.version">
          <div class="line">
            <strong>v{{ r.version }}</strong>
            <span class="cw-muted">{{ r.author }}</span>
            <time class="cw-muted" [attr.datetime]="r.createdAt">{{
              r.createdAt | date: 'd MMM y, HH:mm'
            }}</time>
          </div>
          <div class="message">{{ r.message || '(no message)' }}</div>
          <div class="actions">
            @if (r.version === currentVersion()) {
              <span class="cw-muted">current</span>
            } @else {
              <button mat-button type="button" (click)="view.emit(r.version)">View</button>
              @if (canRestore()) {
                <button mat-stroked-button type="button" (click)="restore.emit(r.version)">
                  Restore
                </button>
              }
            }
          </div>
        </li>
      } @empty {
        <li class="cw-muted">No saved revisions yet.</li>
      }
    </ol>
  `,
  styles: `
    .title {
      font: var(--mat-sys-title-medium);
      margin: 0 0 8px;
    }
    .list {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    li {
      padding: 6px 0;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }
    li.current {
      border-left: 3px solid var(--mat-sys-primary);
      padding-left: 6px;
    }
    .line {
      display: flex;
      gap: 8px;
      flex-wrap: wrap;
      font: var(--mat-sys-body-small);
    }
    .message {
      font: var(--mat-sys-body-medium);
    }
    .actions {
      display: flex;
      gap: 4px;
      align-items: center;
    }
  `,
})
export class RevisionPanelComponent {
  readonly chainId = input.required<string>();
  /** Reloads the list whenever the chain's version changes. */
  readonly currentVersion = input.required<number>();
  readonly canRestore = input(false);
  readonly view = output<number>();
  readonly restore = output<number>();

  private readonly api = inject(ChainsApi);
  protected readonly revisions = signal<RevisionSummaryDto[]>([]);
  protected readonly error = signal<string | null>(null);

  constructor() {
    effect((onCleanup) => {
      this.currentVersion();
      const sub = this.api.revisions(this.chainId()).subscribe({
        next: (list) => {
          this.revisions.set([...list].sort((a, b) => b.version - a.version));
          this.error.set(null);
        },
        error: (e: unknown) => this.error.set(`The history did not load: ${describeHttpError(e)}`),
      });
      onCleanup(() => sub.unsubscribe());
    });
  }
}
