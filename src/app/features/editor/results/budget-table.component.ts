import { Clipboard } from '@angular/cdk/clipboard';
import {
  ChangeDetectionStrategy,
  Component,
  DOCUMENT,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatTableModule } from '@angular/material/table';
import { ColumnChoiceStore } from '../../../core/tables/column-choice';
import {
  ColumnMenuComponent,
  type ChoosableColumn,
} from '../../../core/tables/column-menu.component';
import { ScrollFrameComponent } from '../../../core/tables/scroll-frame.component';
import type { BudgetColumn, BudgetLine, BudgetRow, BudgetTable } from './budget-rows';
import { saveCsv } from '../../report/csv-download';
import { budgetCsv, csvFileName } from './budget-csv';

/** The choice of nodes is kept under this table name. */
const NODE_TABLE = 'budget-nodes';

/** A node is known by the stage that ends at it, so the choice holds across edits. */
function nodeKey(column: BudgetColumn): string {
  return column.stageId ?? column.id;
}

/**
 * The budget at f0: one column per node left to right, as the chain reads on the strip,
 * with the quantity names in a sticky first column so they stay in view while scrolling.
 * The user picks which nodes to show (remembered per account in this browser, by stage).
 */
@Component({
  selector: 'cw-budget-table',
  imports: [MatButtonModule, MatTableModule, ColumnMenuComponent, ScrollFrameComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './budget-table.component.html',
  styleUrl: './budget-table.component.scss',
})
export class BudgetTableComponent {
  readonly table = input.required<BudgetTable>();
  /** Node whose column is highlighted (the selected stage's output node). */
  readonly selectedNode = input<number | null>(null);
  /** Chain name, for the CSV file name. */
  readonly chainName = input.required<string>();
  /** Reference impedance of the chain's figures, Ω, for the CSV file name. */
  readonly referenceOhm = input(50);
  /** Emits the id of the stage whose column header was activated. */
  readonly columnSelected = output<string>();

  private readonly clipboard = inject(Clipboard);
  private readonly page = inject(DOCUMENT);
  private readonly noticeText = signal('');
  /** Outcome of the last copy or download, read out by screen readers. */
  protected readonly notice = this.noticeText.asReadonly();

  private readonly choices = inject(ColumnChoiceStore);
  protected readonly hiddenNodes = this.choices.hidden(NODE_TABLE);

  protected readonly columns = computed(() => this.table().columns);
  protected readonly lines = computed(() => this.table().lines);
  protected readonly nodeChoices = computed<ChoosableColumn[]>(() =>
    this.columns().map((c) => ({ id: nodeKey(c), label: `${c.title}: ${c.after}` })),
  );
  protected readonly displayedColumns = computed(() => {
    const hidden = this.hiddenNodes();
    return [
      'quantity',
      ...this.columns()
        .filter((c) => !hidden.has(nodeKey(c)))
        .map((c) => c.id),
    ];
  });

  protected readonly isQuantity = (_: number, line: BudgetLine) => line.kind === 'quantity';
  protected readonly isGroup = (_: number, line: BudgetLine) => line.kind === 'group';
  protected readonly trackLine = (_: number, line: BudgetLine) => line.key;

  /** Template helper: Material's cell context is untyped, so narrow it here. */
  protected row(line: BudgetLine): BudgetRow | null {
    return line.kind === 'quantity' ? line : null;
  }

  protected showNode(id: string, show: boolean): void {
    this.choices.setHidden(NODE_TABLE, id, !show);
  }

  protected showAllNodes(): void {
    this.choices.showAll(NODE_TABLE);
  }

  protected select(column: BudgetColumn): void {
    if (column.stageId !== null) this.columnSelected.emit(column.stageId);
  }

  protected copyCsv(): void {
    const copied = this.clipboard.copy(budgetCsv(this.table()));
    this.noticeText.set(
      copied ? 'Budget copied as CSV.' : 'The browser refused to copy; use Download CSV.',
    );
  }

  protected downloadCsv(): void {
    const name = csvFileName(this.chainName(), 'budget', this.referenceOhm());
    saveCsv(this.page, name, budgetCsv(this.table()));
    this.noticeText.set(`Saved ${name}.`);
  }
}
