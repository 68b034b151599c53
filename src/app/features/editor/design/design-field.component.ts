import { ChangeDetectionStrategy, Component, input, model } from '@angular/core';

/**
 * One labelled text field of the design tools, bound two ways to the panel's signal: the
 * text as typed (the panel reads and checks it when asked to design).
 */
@Component({
  selector: 'cw-design-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <label>
      {{ label() }}
      <input
        type="text"
        [attr.data-testid]="testId()"
        [attr.placeholder]="placeholder()"
        [value]="value()"
        (input)="value.set(textOf($event))"
      />
    </label>
  `,
  styles: `
    :host {
      display: block;
    }
    input {
      width: 100%;
      box-sizing: border-box;
      font: inherit;
      padding: 0.25rem;
    }
  `,
})
export class DesignFieldComponent {
  readonly label = input.required<string>();
  readonly value = model.required<string>();
  readonly testId = input<string | null>(null);
  readonly placeholder = input<string | null>(null);

  protected textOf(event: Event): string {
    return (event.target as HTMLInputElement).value;
  }
}
