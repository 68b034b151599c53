import { ChangeDetectionStrategy, Component, inject, input, ViewChild } from '@angular/core';
import { MatMenu, MatMenuModule } from '@angular/material/menu';
import type { ExportFormat, TouchstoneVersion } from '../../../../../shared/schema/api';
import type { ChainDocument, Mode } from '../../../../../shared/schema/chain';
import { Ask } from '../../../core/dialogs/ask';
import { withModes } from '../modes/mode-edits';
import { ChainExport } from '../save/chain-export';

/**
 * The export menu: the chain file, the SPICE netlist and Touchstone (1.1, or 2.0 with a
 * reference per port and the cascade's noise data), at 50 Ω or a reference asked for.
 * The menu itself is `menu`, for a button's `[matMenuTriggerFor]` (the toolbar's, or an
 * item of the phone's "more" menu).
 */
@Component({
  selector: 'cw-export-menu',
  imports: [MatMenuModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-menu #menu="matMenu" xPosition="before">
      <button mat-menu-item type="button" (click)="exportAs('json')">
        <span>Chain file (JSON)</span>
      </button>
      <button mat-menu-item type="button" (click)="exportAs('spice')">
        <span>SPICE netlist (ngspice)</span>
      </button>
      <button
        mat-menu-item
        type="button"
        data-testid="export-touchstone"
        [matMenuTriggerFor]="touchstone"
      >
        <span>Touchstone (.s2p)</span>
      </button>
    </mat-menu>
    <mat-menu #touchstone="matMenu" xPosition="before">
      <button mat-menu-item type="button" (click)="exportTouchstone('1.1', 50)">
        <span>Version 1.1, 50 Ω</span>
      </button>
      <button mat-menu-item type="button" (click)="exportTouchstone('2.0', 50)">
        <span>Version 2.0, 50 Ω, with noise data</span>
      </button>
      <button mat-menu-item type="button" (click)="exportTouchstoneAsked('1.1')">
        <span>Version 1.1, other reference…</span>
      </button>
      <button mat-menu-item type="button" (click)="exportTouchstoneAsked('2.0')">
        <span>Version 2.0, other reference…</span>
      </button>
    </mat-menu>
  `,
})
export class ExportMenuComponent {
  /** The document on screen (unsaved edits included, or the revision viewed). */
  readonly document = input.required<ChainDocument>();
  /** The mode shown; null: the chain as written, sent without its modes. */
  readonly mode = input<Mode | null>(null);
  readonly workspaceId = input<string | undefined>(undefined);

  @ViewChild('menu', { static: true }) menu!: MatMenu;

  private readonly exporter = inject(ChainExport);
  private readonly ask = inject(Ask);

  protected exportAs(
    format: ExportFormat,
    touchstone: { z0?: number; version?: TouchstoneVersion } = {},
  ): void {
    const mode = this.mode();
    const doc = mode || format === 'json' ? this.document() : withModes(this.document(), []);
    void this.exporter.download(doc, format, {
      workspaceId: this.workspaceId(),
      ...touchstone,
      ...(mode ? { mode: mode.id } : {}),
    });
  }

  protected exportTouchstone(version: TouchstoneVersion, z0: number): void {
    this.exportAs('touchstone', { version, z0 });
  }

  protected async exportTouchstoneAsked(version: TouchstoneVersion): Promise<void> {
    const z0 = await this.ask.value({
      title: `Touchstone ${version} at another reference`,
      label: 'Reference resistance of both ports',
      hint: 'The S-parameters are given against it, e.g. 75 Ω for television coaxial cable.',
      kind: 'ohm',
      initial: '75 Ω',
      submitLabel: 'Export',
      check: (v) => (v > 0 ? null : 'enter a resistance above 0 Ω'),
    });
    if (z0 !== null) this.exportTouchstone(version, z0);
  }
}
