import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { firstValueFrom } from 'rxjs';
import type { RevisionDiffDto, RevisionSummaryDto } from '../../../../shared/schema/api';
import { ChainsApi } from '../../core/api/chains.api';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { significantFigures } from '../../core/format/number-format';
import { describeHttpError } from '../../core/http/error-message';

/**
 * What changed between two revisions: stages added, removed and moved, values (old → new
 * with units), settings, and the key figures before and after.
 */
@Component({
  selector: 'cw-revision-diff',
  imports: [FormsModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './revision-diff.component.html',
  styleUrl: './revision-diff.component.scss',
})
export class RevisionDiffComponent {
  private readonly chains = inject(ChainsApi);
  private readonly api = inject(ColleaguesApi);

  readonly chainId = input.required<string>();
  /** The chain's version now; a change reloads the list of revisions. */
  readonly currentVersion = input.required<number>();

  protected readonly revisions = signal<RevisionSummaryDto[]>([]);
  protected readonly diff = signal<RevisionDiffDto | null>(null);
  protected readonly failure = signal('');
  protected readonly busy = signal(false);
  protected from = 1;
  protected to = 1;

  constructor() {
    effect(() => void this.loadRevisions(this.chainId(), this.currentVersion()));
  }

  private async loadRevisions(chainId: string, version: number): Promise<void> {
    try {
      const list = await firstValueFrom(this.chains.revisions(chainId));
      this.revisions.set(list);
      this.to = version;
      this.from = Math.max(1, version - 1);
    } catch {
      this.revisions.set([]);
    }
  }

  protected label(r: RevisionSummaryDto): string {
    return `v${r.version} · ${r.author} · ${r.createdAt.slice(0, 10)}${r.message ? ` · ${r.message}` : ''}`;
  }

  protected async compare(): Promise<void> {
    this.busy.set(true);
    this.failure.set('');
    try {
      // The texts (values, settings, key figures) come written at the user's figures.
      const figures = significantFigures();
      this.diff.set(
        await firstValueFrom(this.api.diff(this.chainId(), +this.from, +this.to, figures)),
      );
    } catch (error) {
      this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }

  protected changed(before: string, after: string): boolean {
    return before !== after;
  }
}
