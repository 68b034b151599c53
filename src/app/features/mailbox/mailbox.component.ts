import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import { firstValueFrom } from 'rxjs';
import type {
  CaughtMailDto,
  CaughtMailSummaryDto,
  OutboxMessageDto,
} from '../../../../shared/schema/api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { describeHttpError } from '../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { SessionStore } from '../../core/session/session.store';

/**
 * The site admin's mail page: while the server uses the local mail catcher, the development
 * mailbox (what it caught, each message readable with its links); always, the mail still
 * waiting to go, with a retry.
 */
@Component({
  selector: 'cw-mailbox',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './mailbox.component.html',
  styleUrl: './mailbox.component.scss',
})
export default class MailboxComponent {
  private readonly api = inject(ColleaguesApi);
  private readonly sanitizer = inject(DomSanitizer);
  protected readonly session = inject(SessionStore);

  protected readonly messages = signal<CaughtMailSummaryDto[]>([]);
  protected readonly open = signal<CaughtMailDto | null>(null);
  protected readonly openHtml = signal<SafeHtml | null>(null);
  protected readonly unavailable = signal('');
  protected readonly outbox = signal<OutboxMessageDto[]>([]);
  protected readonly view = signal<'html' | 'text'>('html');

  constructor() {
    void this.refresh();
  }

  protected async refresh(): Promise<void> {
    await this.session.ensureLoaded();
    if (this.session.mailCatcher()) await this.loadCaught();
    this.outbox.set(await firstValueFrom(this.api.outbox()).catch(() => []));
  }

  private async loadCaught(): Promise<void> {
    try {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [404]);
      this.messages.set(await firstValueFrom(this.api.mailbox(context)));
      this.unavailable.set('');
    } catch (error) {
      this.unavailable.set(describeHttpError(error));
    }
  }

  protected async read(m: CaughtMailSummaryDto): Promise<void> {
    const mail = await firstValueFrom(this.api.caughtMail(m.id));
    this.open.set(mail);
    // Our own messages, shown in a sandboxed frame (no scripts run there); links open a tab.
    this.openHtml.set(
      mail.html
        ? this.sanitizer.bypassSecurityTrustHtml(
            mail.html.replace('<head>', '<head><base target="_blank">'),
          )
        : null,
    );
  }

  protected async retry(m: OutboxMessageDto): Promise<void> {
    await firstValueFrom(this.api.retryMail(m.id));
    await this.refresh();
  }

  /** Plain text with its links made clickable. */
  protected parts(text: string): { text: string; href: string | null }[] {
    return text
      .split(/(https?:\/\/\S+)/)
      .filter((t) => t !== '')
      .map((t) => ({ text: t, href: /^https?:\/\//.test(t) ? t : null }));
  }
}
