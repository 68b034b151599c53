import { computed, DestroyRef, inject, Injectable, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { ChainSavedEventDto, CommentDto, PresentUserDto } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';

/**
 * What colleagues do on the open chain: who else has it open, a save by someone else, and
 * the comments. Fed by the server's event stream (GET /api/chains/:id/events), which the
 * browser reconnects by itself. Provided by the chain editor, one per open chain.
 */
@Injectable()
export class CollabStore {
  private readonly api = inject(ColleaguesApi);
  private source: EventSource | null = null;
  private chainId: string | null = null;
  private versionNow: () => number = () => 0;

  private readonly presentState = signal<PresentUserDto[]>([]);
  private readonly savedState = signal<ChainSavedEventDto | null>(null);
  private readonly commentsState = signal<CommentDto[]>([]);
  private readonly connectedState = signal(false);

  /** Everyone with this chain open, the caller included. */
  readonly present = this.presentState.asReadonly();
  /** A newer version saved by someone else, until loaded or dismissed. */
  readonly savedElsewhere = this.savedState.asReadonly();
  readonly comments = this.commentsState.asReadonly();
  readonly connected = this.connectedState.asReadonly();
  /** Comments per stage id ('' for comments on the whole chain). */
  readonly countByStage = computed(() => {
    const counts = new Map<string, number>();
    for (const c of this.commentsState()) {
      const key = c.stageId ?? '';
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    return counts;
  });
  /** The stage whose comments are asked for (a card's count was clicked), and when. */
  readonly commentsRequest = signal<{ stageId: string | null; at: number } | null>(null);

  constructor() {
    inject(DestroyRef).onDestroy(() => this.stop());
  }

  /** Opens the stream for `chainId`; `currentVersion` tells a save by others from one's own. */
  start(chainId: string, currentVersion: () => number): void {
    if (this.chainId === chainId && this.source) return;
    this.stop();
    this.chainId = chainId;
    this.versionNow = currentVersion;
    void this.reloadComments();
    if (typeof EventSource === 'undefined') return;
    const source = new EventSource(`/api/chains/${encodeURIComponent(chainId)}/events`);
    this.source = source;
    source.onopen = () => this.connectedState.set(true);
    source.onerror = () => this.connectedState.set(false);
    source.addEventListener('presence', (e) => {
      const data = JSON.parse((e as MessageEvent<string>).data) as { users: PresentUserDto[] };
      this.presentState.set(data.users);
    });
    source.addEventListener('saved', (e) => {
      const data = JSON.parse((e as MessageEvent<string>).data) as ChainSavedEventDto;
      if (data.version > this.versionNow()) this.savedState.set(data);
    });
    source.addEventListener('comments', () => void this.reloadComments());
  }

  stop(): void {
    this.source?.close();
    this.source = null;
    this.chainId = null;
    this.connectedState.set(false);
    this.presentState.set([]);
  }

  dismissSaved(): void {
    this.savedState.set(null);
  }

  askForComments(stageId: string | null): void {
    this.commentsRequest.set({ stageId, at: Date.now() });
  }

  async reloadComments(): Promise<void> {
    const id = this.chainId;
    if (!id) return;
    try {
      const list = await firstValueFrom(this.api.comments(id));
      if (id === this.chainId) this.commentsState.set(list);
    } catch {
      // The error interceptor said why; the list stays as it was.
    }
  }
}
