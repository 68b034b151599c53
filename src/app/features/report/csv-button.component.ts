import { ChangeDetectionStrategy, Component, DOCUMENT, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { CsvTable } from '../../../../shared/io/csv-writer';
import { saveCsv } from './csv-download';

/**
 * "Download CSV" for one table: the tables are built only when the button is pressed,
 * and the file name comes from the shared naming helper (chain, mode, reference, table).
 */
@Component({
  selector: 'cw-csv-button',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <button
      mat-stroked-button
      type="button"
      class="csv"
      [attr.aria-label]="label() + ': ' + what()"
      [attr.data-csv]="fileName()"
      (click)="download()"
    >
      {{ label() }}
    </button>
    <span class="cw-visually-hidden" aria-live="polite">{{ notice() }}</span>
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
    }
  `,
})
export class CsvButtonComponent {
  /** Builds the tables to write (called on click). */
  readonly tables = input.required<() => CsvTable[]>();
  readonly fileName = input.required<string>();
  /** What the table is, for the button's accessible name ("resonators"). */
  readonly what = input.required<string>();
  readonly label = input('Download CSV');

  private readonly page = inject(DOCUMENT);
  protected readonly notice = signal('');

  protected download(): void {
    const name = saveCsv(this.page, this.fileName(), this.tables()());
    this.notice.set(`Saved ${name}.`);
  }
}
