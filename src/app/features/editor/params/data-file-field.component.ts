import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  ElementRef,
  inject,
  input,
  output,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { firstValueFrom } from 'rxjs';
import type { DataFileKind, DataFileSummaryDto } from '../../../../../shared/schema/api';
import { DataFilesApi } from '../../../core/api/data-files.api';
import { describeHttpError } from '../../../core/http/error-message';

/** The stage types that read a measured data file, and the kind each one takes. */
export const DATA_FILE_KIND_OF_TYPE: Readonly<Record<string, DataFileKind>> = {
  'measured-antenna': 's1p',
  'measured-two-port': 's2p',
};

const UPLOAD = '__upload';

/** A file chosen for a stage (fileId null: none, the stage's own table). */
export interface DataFilePick {
  stageId: string;
  fileId: string | null;
}

/**
 * "Data file" for a measured stage: the workspace's files of the stage's kind, none (the
 * stage's own table), or a Touchstone file uploaded from this machine. Picking one emits
 * its id (null for none) with the stage it was picked for; the panel turns that into an
 * undoable edit. An upload is for the stage shown when it started, even if another stage of
 * the same kind is shown by the time it lands.
 */
@Component({
  selector: 'cw-data-file-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <label class="label" [for]="selectId()">Data file</label>
    <select
      [id]="selectId()"
      data-param="dataFileId"
      [disabled]="disabled() || busy()"
      (change)="onChange($event)"
    >
      <option value="" [selected]="!selected()">None: use the table below</option>
      @for (file of files(); track file.id) {
        <option [value]="file.id" [selected]="file.id === selected()">
          {{ file.name }} ({{ file.pointCount }} points)
        </option>
      }
      @if (missing()) {
        <option [value]="selected()" selected>File not in this workspace</option>
      }
      @if (!disabled()) {
        <option [value]="upload">Upload Touchstone…</option>
      }
    </select>
    <input
      #fileInput
      type="file"
      accept=".s1p,.s2p,.ts"
      hidden
      data-testid="data-file-input"
      (change)="onFile($event)"
    />
    @if (error(); as message) {
      <span class="cw-error-text note" role="alert">{{ message }}</span>
    } @else if (busy()) {
      <span class="cw-muted note">Uploading…</span>
    } @else {
      <span class="cw-muted note">{{ hint() }}</span>
    }
  `,
  styleUrl: './field.scss',
})
export class DataFileFieldComponent {
  /** The workspace whose files are offered. */
  readonly workspaceId = input.required<string>();
  /** 's1p' for a measured antenna, 's2p' for a measured two-port. */
  readonly kind = input.required<DataFileKind>();
  /** The stage the field chooses a file for. */
  readonly stageId = input.required<string>();
  /** The stage's current `dataFileId`, if any. */
  readonly selected = input<string | undefined>(undefined);
  readonly disabled = input(false);
  /** The file picked (null: none) and the stage it is for. */
  readonly picked = output<DataFilePick>();

  private readonly api = inject(DataFilesApi);
  private readonly fileInput = viewChild.required<ElementRef<HTMLInputElement>>('fileInput');

  protected readonly upload = UPLOAD;
  protected readonly selectId = computed(() => `cw-data-file-${this.kind()}`);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  private readonly all = signal<DataFileSummaryDto[]>([]);
  protected readonly files = computed(() => this.all().filter((f) => f.kind === this.kind()));
  protected readonly missing = computed(() => {
    const id = this.selected();
    return !!id && !this.files().some((f) => f.id === id);
  });
  protected readonly hint = computed(() =>
    this.kind() === 's1p'
      ? 'A one-port file (.s1p) of the antenna impedance; it replaces the table.'
      : 'A two-port file (.s2p, or a Touchstone 2.0 .ts) of the measured S-parameters, with ' +
        'noise parameters if it has them; it replaces the table.',
  );

  constructor() {
    effect(() => {
      const wid = this.workspaceId();
      untracked(() => void this.refresh(wid));
    });
  }

  private async refresh(workspaceId: string): Promise<void> {
    this.all.set([]);
    try {
      const listed = await firstValueFrom(this.api.list(workspaceId));
      if (workspaceId !== this.workspaceId()) return; // another workspace's list is on its way
      // A file uploaded while the list was on its way stays offered (and shown as chosen).
      this.all.update((uploaded) => [
        ...listed,
        ...uploaded.filter((f) => !listed.some((l) => l.id === f.id)),
      ]);
    } catch (err) {
      this.error.set(`The data files could not be listed: ${describeHttpError(err)}`);
    }
  }

  protected onChange(event: Event): void {
    const select = event.target as HTMLSelectElement;
    if (select.value === UPLOAD) {
      // Back to the current choice until the upload has a file to show.
      select.value = this.selected() ?? '';
      this.fileInput().nativeElement.click();
      return;
    }
    this.error.set(null);
    this.picked.emit({ stageId: this.stageId(), fileId: select.value || null });
  }

  protected async onFile(event: Event): Promise<void> {
    const inputEl = event.target as HTMLInputElement;
    const file = inputEl.files?.[0];
    inputEl.value = '';
    if (!file) return;
    const stageId = this.stageId();
    this.busy.set(true);
    this.error.set(null);
    try {
      const content = await file.text();
      const stored = await firstValueFrom(this.api.upload(this.workspaceId(), file.name, content));
      this.all.update((files) => [...files, stored]);
      if (stored.kind === this.kind()) {
        this.picked.emit({ stageId, fileId: stored.id });
      } else {
        this.error.set(
          `${stored.name} is a ${stored.portCount}-port file; this stage needs a .${this.kind()} file`,
        );
      }
    } catch (err) {
      this.error.set(
        err instanceof HttpErrorResponse && typeof err.error?.message === 'string'
          ? err.error.message
          : `The file could not be uploaded: ${describeHttpError(err)}`,
      );
    } finally {
      this.busy.set(false);
    }
  }
}
