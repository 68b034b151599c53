import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { firstValueFrom } from 'rxjs';
import type { PartDto, PartsPreviewDto } from '../../../../shared/schema/api';
import { PartsApi } from '../../core/api/parts.api';
import { ScrollFrameComponent } from '../../core/tables/scroll-frame.component';
import { describeHttpError } from '../../core/http/error-message';
import { SessionStore } from '../../core/session/session.store';
import { formatPart, PART_FIELD_LABELS, type PartFieldKey } from './part-format';

interface Upload {
  fileName: string;
  text: string;
  preview: PartsPreviewDto;
}

/**
 * A workspace's parts bin: the inductors and capacitors the team stocks. Editors upload a
 * CSV, map its columns to the fields in a preview, and add it to the bin or replace it.
 */
@Component({
  selector: 'cw-parts-bin',
  imports: [MatButtonModule, MatIconModule, ScrollFrameComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './parts-bin.component.html',
  styleUrl: './parts-bin.component.scss',
})
export default class PartsBinComponent {
  protected readonly session = inject(SessionStore);
  private readonly api = inject(PartsApi);

  /** From the route. */
  readonly workspaceId = input.required<string>();

  protected readonly parts = signal<PartDto[]>([]);
  protected readonly upload = signal<Upload | null>(null);
  protected readonly error = signal('');
  protected readonly busy = signal(false);
  protected readonly fields = Object.entries(PART_FIELD_LABELS) as [PartFieldKey, string][];
  protected readonly format = formatPart;

  constructor() {
    effect(() => {
      const wid = this.workspaceId();
      untracked(() => void this.refresh(wid));
    });
  }

  private async refresh(workspaceId: string): Promise<void> {
    try {
      this.parts.set(await firstValueFrom(this.api.list(workspaceId)));
    } catch (err) {
      this.error.set(`The parts bin could not be read: ${describeHttpError(err)}`);
    }
  }

  protected async onFile(event: Event): Promise<void> {
    const inputEl = event.target as HTMLInputElement;
    const file = inputEl.files?.[0];
    inputEl.value = '';
    if (!file) return;
    await this.previewWith(file.name, await file.text(), undefined);
  }

  protected async onMapping(field: PartFieldKey, event: Event): Promise<void> {
    const current = this.upload();
    if (!current) return;
    const value = (event.target as HTMLSelectElement).value;
    const mapping = { ...current.preview.mapping };
    if (value === '') delete mapping[field];
    else mapping[field] = Number(value);
    await this.previewWith(current.fileName, current.text, mapping);
  }

  private async previewWith(
    fileName: string,
    text: string,
    mapping: PartsPreviewDto['mapping'] | undefined,
  ): Promise<void> {
    this.busy.set(true);
    this.error.set('');
    try {
      const preview = await firstValueFrom(
        this.api.preview(this.workspaceId(), { text, ...(mapping ? { mapping } : {}) }),
      );
      this.upload.set({ fileName, text, preview });
    } catch (err) {
      this.upload.set(null);
      this.error.set(`${fileName}: ${refusal(err)}`);
    } finally {
      this.busy.set(false);
    }
  }

  protected async importUpload(replace: boolean): Promise<void> {
    const current = this.upload();
    if (!current) return;
    this.busy.set(true);
    try {
      const body = { text: current.text, mapping: current.preview.mapping, replace };
      const result = await firstValueFrom(this.api.import(this.workspaceId(), body));
      this.parts.set(result.parts);
      this.upload.set(null);
    } catch (err) {
      this.error.set(`${current.fileName}: ${refusal(err)}`);
    } finally {
      this.busy.set(false);
    }
  }

  protected cancel(): void {
    this.upload.set(null);
    this.error.set('');
  }

  protected async remove(part: PartDto): Promise<void> {
    try {
      await firstValueFrom(this.api.remove(this.workspaceId(), part.id));
      this.parts.update((list) => list.filter((p) => p.id !== part.id));
    } catch {
      // The error interceptor has shown why.
    }
  }
}

function refusal(err: unknown): string {
  if (err instanceof HttpErrorResponse && typeof err.error?.message === 'string') {
    return err.error.message as string;
  }
  return describeHttpError(err);
}
