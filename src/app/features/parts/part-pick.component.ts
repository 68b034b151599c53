import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';
import { firstValueFrom } from 'rxjs';
import type { PartDto } from '../../../../shared/schema/api';
import type { PartRef } from '../../../../shared/schema/chain';
import { PartsApi } from '../../core/api/parts.api';
import { formatPart } from './part-format';
import { describePartRef } from './with-part';

/**
 * "From bin" beside an inductance or capacitance: a menu of the workspace's parts of that
 * kind (read when opened); picking one emits it. Shows which part the value came from.
 */
@Component({
  selector: 'cw-part-pick',
  imports: [MatButtonModule, MatMenuModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (!disabled()) {
      <button
        mat-button
        type="button"
        class="pick"
        [matMenuTriggerFor]="menu"
        (menuOpened)="load()"
        [attr.aria-label]="'Pick ' + label() + ' from the parts bin'"
        [attr.data-pick]="paramKey()"
      >
        From bin
      </button>
      <mat-menu #menu="matMenu">
        @if (parts() === null) {
          <span class="cw-muted note" mat-menu-item disabled>Reading the bin…</span>
        } @else {
          @for (p of parts(); track p.id) {
            @let shown = format(p);
            <button mat-menu-item type="button" (click)="picked.emit(p)">
              {{ p.partNumber || shown.value }} · {{ shown.value }} · {{ shown.q }} ·
              {{ shown.tolerance }}
            </button>
          } @empty {
            <span mat-menu-item disabled>No {{ kind() }}s in the bin yet</span>
          }
        }
      </mat-menu>
    }
    @if (current(); as ref) {
      <span class="cw-muted note from" [attr.data-part-of]="paramKey()">{{ describe(ref) }}</span>
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 4px 8px;
      grid-column: 1 / -1;
    }
    .note {
      font: var(--mat-sys-body-small);
    }
  `,
})
export class PartPickComponent {
  readonly workspaceId = input.required<string>();
  readonly kind = input.required<'inductor' | 'capacitor'>();
  readonly label = input('');
  readonly paramKey = input('');
  /** The part the value came from, if any. */
  readonly current = input<PartRef | undefined>(undefined);
  readonly disabled = input(false);
  readonly picked = output<PartDto>();

  private readonly api = inject(PartsApi);
  protected readonly parts = signal<PartDto[] | null>(null);
  protected readonly format = formatPart;
  protected readonly describe = describePartRef;

  protected async load(): Promise<void> {
    try {
      const all = await firstValueFrom(this.api.list(this.workspaceId()));
      this.parts.set(all.filter((p) => p.kind === this.kind()));
    } catch {
      this.parts.set([]);
    }
  }
}
