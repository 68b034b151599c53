import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { firstValueFrom } from 'rxjs';
import type { ShareLinkDto } from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { describeHttpError } from '../../core/http/error-message';

export interface ShareDialogData {
  chainId: string;
  chainName: string;
  /** Editors make and withdraw read-only links; every member may send the chain. */
  canManageLinks: boolean;
}

/** Read-only links to a chain (make, copy, withdraw) and "send to a colleague". */
@Component({
  selector: 'cw-share-dialog',
  imports: [FormsModule, MatButtonModule, MatDialogModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './share-dialog.component.html',
  styleUrl: './share-dialog.component.scss',
})
export class ShareDialogComponent {
  protected readonly data = inject<ShareDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(ColleaguesApi);
  private readonly clipboard = inject(Clipboard);

  protected readonly links = signal<ShareLinkDto[]>([]);
  protected readonly fresh = signal<ShareLinkDto | null>(null);
  protected readonly notice = signal('');
  protected readonly failure = signal('');
  protected readonly busy = signal(false);
  protected expiresInDays = '30';
  protected email = '';
  protected note = '';

  constructor() {
    if (this.data.canManageLinks) void this.load();
  }

  private async load(): Promise<void> {
    this.links.set(await firstValueFrom(this.api.shareLinks(this.data.chainId)).catch(() => []));
  }

  protected async create(): Promise<void> {
    this.busy.set(true);
    this.failure.set('');
    try {
      const days = Number(this.expiresInDays) || undefined;
      const link = await firstValueFrom(this.api.createShareLink(this.data.chainId, days));
      this.fresh.set(link);
      await this.load();
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }

  protected copy(url: string): void {
    this.clipboard.copy(url);
    this.notice.set('Link copied.');
  }

  protected async revoke(link: ShareLinkDto): Promise<void> {
    await firstValueFrom(this.api.revokeShareLink(this.data.chainId, link.id));
    if (this.fresh()?.id === link.id) this.fresh.set(null);
    this.notice.set('The link no longer opens the chain.');
    await this.load();
  }

  protected async send(): Promise<void> {
    if (!this.email.trim()) return;
    this.busy.set(true);
    this.failure.set('');
    try {
      const answer = await firstValueFrom(
        this.api.sendChain(this.data.chainId, this.email.trim(), this.note),
      );
      this.notice.set(
        answer.mail.sent
          ? `Sent to ${this.email.trim()}. They need to be a member of this workspace to open it.`
          : (answer.mail.message ?? 'The mail could not be sent yet; it is retried.'),
      );
      this.email = '';
      this.note = '';
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
