import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';

/** Above a field the selected mode sets: says so, and offers the chain's own value back. */
@Component({
  selector: 'cw-override-mark',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="mark" data-testid="override-mark">
      <span class="dot" aria-hidden="true"></span>
      <span>Set in “{{ modeName() }}”</span>
      @if (!readOnly()) {
        <button
          type="button"
          class="clear"
          [attr.aria-label]="clearLabel()"
          (click)="cleared.emit()"
        >
          Use the chain’s value
        </button>
      }
    </p>
  `,
  styles: `
    .mark {
      display: flex;
      align-items: center;
      gap: 6px;
      margin: 8px 0 -4px;
      font: var(--mat-sys-label-medium);
      color: var(--mat-sys-primary);
    }
    .dot {
      width: 8px;
      height: 8px;
      border-radius: 50%;
      background: var(--mat-sys-primary);
    }
    .clear {
      border: none;
      background: none;
      padding: 0 2px;
      color: var(--mat-sys-primary);
      text-decoration: underline;
      cursor: pointer;
      font: inherit;
    }
  `,
})
export class OverrideMarkComponent {
  readonly modeName = input.required<string>();
  /** The parameter's label, for the button's accessible name. */
  readonly label = input.required<string>();
  readonly readOnly = input(false);
  readonly cleared = output<void>();
  protected readonly clearLabel = computed(
    () => `Use the chain’s own ${this.label()} in ${this.modeName()}`,
  );
}
