import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { CollabStore } from './collab.store';

/** Who else has this chain open: one round badge with initials per person. */
@Component({
  selector: 'cw-presence-bar',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (others().length > 0) {
      <div class="here" data-testid="presence" [attr.aria-label]="label()" role="status">
        @for (u of others(); track u.userId) {
          <span class="badge" [title]="u.displayName + ' has this chain open'">{{
            initials(u.displayName)
          }}</span>
        }
        <!-- The names are in each badge's tooltip; the toolbar keeps to one line. -->
        <span class="cw-visually-hidden">{{ label() }}</span>
      </div>
    }
  `,
  styles: `
    .here {
      display: inline-flex;
      align-items: center;
      gap: 4px;
    }
    .badge {
      display: inline-grid;
      place-items: center;
      width: 28px;
      height: 28px;
      border-radius: 50%;
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
      font-size: 12px;
      font-weight: 700;
      border: 2px solid var(--mat-sys-surface);
    }
  `,
})
export class PresenceBarComponent {
  private readonly collab = inject(CollabStore);
  /** The signed-in user, left out of the list. */
  readonly selfId = input<string | null>(null);

  protected readonly others = computed(() =>
    this.collab.present().filter((u) => u.userId !== this.selfId()),
  );
  protected readonly label = computed(() => {
    const names = this.others().map((u) => u.displayName);
    if (names.length === 0) return '';
    return names.length === 1
      ? `${names[0]} is here too`
      : `${names.slice(0, -1).join(', ')} and ${names.at(-1)} are here too`;
  });

  protected initials(name: string): string {
    const parts = name.trim().split(/\s+/);
    return (
      (parts[0]?.[0] ?? '') + (parts.length > 1 ? (parts.at(-1)?.[0] ?? '') : '')
    ).toUpperCase();
  }
}
