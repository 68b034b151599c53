import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { firstValueFrom } from 'rxjs';
import type { CommentDto } from '../../../../shared/schema/api';
import type { StageInstance } from '../../../../shared/schema/chain';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { Ask } from '../../core/dialogs/ask';
import { CollabStore } from '../presence/collab.store';

/**
 * Comments on the selected stage or on the whole chain. Every member writes (viewers too);
 * authors edit and delete their own; owners delete any. An address in the text (e.g.
 * @ana@example.org) tells that member by mail.
 */
@Component({
  selector: 'cw-comments-panel',
  imports: [FormsModule, MatButtonModule, MatButtonToggleModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="head">
      <mat-button-toggle-group
        aria-label="Comments on"
        [value]="scope()"
        (change)="scope.set($event.value)"
        hideSingleSelectionIndicator
      >
        <mat-button-toggle value="stage" [disabled]="!stage()">This stage</mat-button-toggle>
        <mat-button-toggle value="chain">Whole chain</mat-button-toggle>
      </mat-button-toggle-group>
    </div>
    <h2 class="title">{{ heading() }}</h2>
    @if (shown().length === 0) {
      <p class="cw-muted">No comments yet.</p>
    }
    <ol class="list" aria-label="Comments">
      @for (c of shown(); track c.id) {
        <li data-testid="comment">
          <div class="meta">
            <strong>{{ c.author }}</strong>
            <span class="cw-muted">{{ when(c) }}{{ c.editedAt ? ' · edited' : '' }}</span>
          </div>
          @if (editing() === c.id) {
            <textarea
              class="text"
              rows="3"
              maxlength="4000"
              aria-label="Edit comment"
              [(ngModel)]="editText"
            ></textarea>
            <div class="row">
              <button mat-flat-button type="button" (click)="saveEdit(c)">Save</button>
              <button mat-button type="button" (click)="editing.set(null)">Cancel</button>
            </div>
          } @else {
            <p class="body">{{ c.body }}</p>
            <div class="row">
              @if (c.authorId === userId()) {
                <button mat-button type="button" (click)="startEdit(c)">Edit</button>
              }
              @if (c.authorId === userId() || isOwner()) {
                <button mat-button type="button" (click)="remove(c)">Delete</button>
              }
            </div>
          }
        </li>
      }
    </ol>
    <form (ngSubmit)="post()" class="write">
      <label class="cw-visually-hidden" for="cw-new-comment">New comment</label>
      <textarea
        id="cw-new-comment"
        class="text"
        rows="3"
        maxlength="4000"
        name="body"
        placeholder="Write a comment; an e-mail address tells that colleague"
        [(ngModel)]="draft"
      ></textarea>
      @if (failure(); as text) {
        <p class="cw-error-text" role="alert">{{ text }}</p>
      }
      @if (told(); as text) {
        <p class="cw-muted" role="status" data-testid="comment-told">{{ text }}</p>
      }
      @for (problem of mailProblems(); track $index) {
        <p class="cw-error-text" role="alert">{{ problem }}</p>
      }
      <button mat-flat-button type="submit" [disabled]="busy() || !draft.trim()">
        Post comment
      </button>
    </form>
  `,
  styles: `
    :host {
      display: block;
      padding: 12px;
    }
    .title {
      font: var(--mat-sys-title-small);
      margin: 12px 0 8px;
    }
    .list {
      list-style: none;
      padding: 0;
      margin: 0 0 12px;
    }
    .list li {
      border-left: 3px solid var(--mat-sys-tertiary);
      padding: 4px 0 4px 10px;
      margin-bottom: 10px;
    }
    .meta {
      display: flex;
      gap: 8px;
      align-items: baseline;
      flex-wrap: wrap;
    }
    .body {
      white-space: pre-wrap;
      margin: 4px 0;
    }
    .row {
      display: flex;
      gap: 4px;
    }
    .text {
      width: 100%;
      box-sizing: border-box;
      font: inherit;
      padding: 8px;
      border: 1px solid var(--mat-sys-outline);
      border-radius: 6px;
      background: var(--mat-sys-surface);
      color: var(--mat-sys-on-surface);
    }
    .write {
      display: flex;
      flex-direction: column;
      gap: 8px;
      align-items: flex-start;
    }
  `,
})
export class CommentsPanelComponent {
  private readonly api = inject(ColleaguesApi);
  private readonly collab = inject(CollabStore);
  private readonly ask = inject(Ask);

  readonly chainId = input.required<string>();
  readonly stages = input.required<StageInstance[]>();
  readonly selectedStageId = input<string | null>(null);
  readonly userId = input<string | null>(null);
  readonly isOwner = input(false);

  protected readonly scope = signal<'stage' | 'chain'>('stage');
  protected readonly editing = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly failure = signal('');
  /** After a post: who was told by mail, and any mention mail that did not go yet. */
  protected readonly told = signal('');
  protected readonly mailProblems = signal<string[]>([]);
  protected draft = '';
  protected editText = '';

  protected readonly stage = computed(
    () => this.stages().find((s) => s.id === this.selectedStageId()) ?? null,
  );
  private readonly stageIdShown = computed(() =>
    this.scope() === 'stage' && this.stage() ? this.stage()!.id : null,
  );
  protected readonly shown = computed(() =>
    this.collab.comments().filter((c) => (c.stageId ?? null) === this.stageIdShown()),
  );
  protected readonly heading = computed(() => {
    const s = this.stageIdShown() ? this.stage() : null;
    return s ? `On stage “${s.label || s.type}”` : 'On the whole chain';
  });

  protected when(c: CommentDto): string {
    return c.createdAt.slice(0, 16).replace('T', ' ') + ' UTC';
  }

  protected async post(): Promise<void> {
    const body = this.draft.trim();
    if (!body || this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    this.told.set('');
    this.mailProblems.set([]);
    try {
      const posted = await firstValueFrom(
        this.api.addComment(this.chainId(), body, this.stageIdShown()),
      );
      this.draft = '';
      const notified = posted.notified ?? [];
      if (notified.length) this.told.set(`Mentioned by mail: ${notified.join(', ')}.`);
      this.mailProblems.set(posted.mailProblems ?? []);
      await this.collab.reloadComments();
    } catch {
      this.failure.set('The comment was not posted; it is still here to try again.');
    } finally {
      this.busy.set(false);
    }
  }

  protected startEdit(c: CommentDto): void {
    this.editText = c.body;
    this.editing.set(c.id);
  }

  protected async saveEdit(c: CommentDto): Promise<void> {
    const body = this.editText.trim();
    if (!body) return;
    await firstValueFrom(this.api.editComment(this.chainId(), c.id, body));
    this.editing.set(null);
    await this.collab.reloadComments();
  }

  protected async remove(c: CommentDto): Promise<void> {
    const sure = await this.ask.confirm({
      title: 'Delete comment',
      message: 'Delete this comment for everyone on this chain? This cannot be undone.',
      confirmLabel: 'Delete',
    });
    if (!sure) return;
    await firstValueFrom(this.api.deleteComment(this.chainId(), c.id));
    await this.collab.reloadComments();
  }
}
