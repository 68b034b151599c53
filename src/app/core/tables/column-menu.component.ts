import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';

/** A column the user may show or hide. */
export interface ChoosableColumn {
  id: string;
  label: string;
}

/**
 * "Columns" button with a menu of check boxes: the user picks which columns of a table to
 * show. The row-label column is not in the list: it always shows.
 */
@Component({
  selector: 'cw-column-menu',
  imports: [MatButtonModule, MatMenuModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <button
      mat-stroked-button
      type="button"
      class="trigger"
      [matMenuTriggerFor]="menu"
      [attr.aria-label]="'Choose the ' + noun() + ' to show'"
    >
      {{ title() }} ({{ columns().length - hiddenCount() }} of {{ columns().length }})
    </button>
    <mat-menu #menu="matMenu" class="cw-column-menu">
      @for (column of columns(); track column.id) {
        <!-- The menu stays open while columns are ticked: the click stops here. -->
        <button
          mat-menu-item
          type="button"
          role="menuitemcheckbox"
          [attr.aria-checked]="!hidden().has(column.id)"
          (click)="$event.stopPropagation(); toggle(column.id)"
        >
          <span class="box" aria-hidden="true">{{ hidden().has(column.id) ? '' : '✓' }}</span>
          {{ column.label }}
        </button>
      }
      <button mat-menu-item type="button" (click)="showAll.emit()">Show all</button>
    </mat-menu>
  `,
  styles: `
    .box {
      display: inline-block;
      width: 1.2em;
      margin-right: 6px;
      border: 1px solid currentColor;
      border-radius: 3px;
      text-align: center;
      line-height: 1.1;
    }
  `,
})
export class ColumnMenuComponent {
  readonly columns = input.required<ChoosableColumn[]>();
  readonly hidden = input.required<ReadonlySet<string>>();
  /** The button's words, e.g. "Columns" or "Nodes". */
  readonly title = input('Columns');
  readonly noun = input('columns');
  readonly toggled = output<{ id: string; show: boolean }>();
  readonly showAll = output<void>();

  protected toggle(id: string): void {
    this.toggled.emit({ id, show: this.hidden().has(id) });
  }

  protected hiddenCount(): number {
    return this.columns().filter((c) => this.hidden().has(c.id)).length;
  }
}
