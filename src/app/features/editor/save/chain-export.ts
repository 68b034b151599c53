import {
  HttpClient,
  HttpContext,
  HttpErrorResponse,
  type HttpResponse,
} from '@angular/common/http';
import { DOCUMENT, inject, Injectable, signal } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { firstValueFrom } from 'rxjs';
import type {
  ExportFormat,
  ExportRequest,
  TouchstoneVersion,
} from '../../../../../shared/schema/api';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import { describeHttpError } from '../../../core/http/error-message';
import { SKIP_ERROR_SNACKBAR } from '../../../core/http/http-context';

/** What each export is called in messages, and its file ending when the server names none. */
const EXPORT_KINDS: Record<ExportFormat, { what: string; extension: string }> = {
  json: { what: 'chain file', extension: 'chain.json' },
  spice: { what: 'SPICE netlist', extension: 'cir' },
  touchstone: { what: 'Touchstone file', extension: 's2p' },
};

/** The file name a `Content-Disposition: attachment; filename="…"` header gives, if any. */
export function fileNameFromDisposition(header: string | null): string | null {
  if (!header) return null;
  const encoded = /filename\*\s*=\s*UTF-8''([^;]+)/i.exec(header);
  if (encoded) {
    try {
      return safeFileName(decodeURIComponent(encoded[1].trim()));
    } catch {
      // A malformed escape: fall back to the plain parameter.
    }
  }
  const plain = /filename\s*=\s*(?:"([^"]*)"|([^;]+))/i.exec(header);
  return plain ? safeFileName((plain[1] ?? plain[2]).trim()) : null;
}

/** No folders in a downloaded file's name. */
function safeFileName(name: string): string | null {
  const base = name.split(/[\\/]/).pop()?.trim() ?? '';
  return base && base !== '.' && base !== '..' ? base : null;
}

/**
 * Exports the chain on screen through POST /api/export (so unsaved edits are included) and
 * hands the answer to the browser as a download. A chain the server cannot export (422)
 * is explained in a snackbar with the server's message.
 */
@Injectable({ providedIn: 'root' })
export class ChainExport {
  private readonly http = inject(HttpClient);
  private readonly snackBar = inject(MatSnackBar);
  private readonly page = inject(DOCUMENT);
  private readonly running = signal<ExportFormat | null>(null);

  /** The export being fetched, or null. */
  readonly busy = this.running.asReadonly();

  /** Resolves to the downloaded file's name, or null when nothing was downloaded. */
  async download(
    document: ChainDocument,
    format: ExportFormat,
    options: { z0?: number; workspaceId?: string; mode?: string; version?: TouchstoneVersion } = {},
  ): Promise<string | null> {
    if (this.running()) return null;
    this.running.set(format);
    const body: ExportRequest = { document, format };
    if (options.z0 !== undefined) body.z0 = options.z0;
    if (options.version !== undefined) body.version = options.version;
    // The workspace lets the server find the data files the stages refer to.
    if (options.workspaceId) body.workspaceId = options.workspaceId;
    // A mode's export: the chain as that mode makes it, the mode named in file and header.
    if (options.mode) body.mode = options.mode;
    try {
      const answer = await firstValueFrom(
        this.http.post('/api/export', body, {
          observe: 'response',
          responseType: 'text',
          // The error body arrives as text here, so the interceptor could not read it.
          context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [422]),
        }),
      );
      return this.save(answer, document.name, format);
    } catch (error) {
      if (error instanceof HttpErrorResponse && error.status === 422) {
        const reason = describeHttpError(withJsonBody(error));
        this.snackBar.open(`The ${EXPORT_KINDS[format].what} was not made: ${reason}`, 'Dismiss', {
          duration: 10000,
        });
      }
      return null;
    } finally {
      this.running.set(null);
    }
  }

  private save(answer: HttpResponse<string>, chainName: string, format: ExportFormat): string {
    const name =
      fileNameFromDisposition(answer.headers.get('Content-Disposition')) ??
      `${chainName.trim() || 'chain'}.${EXPORT_KINDS[format].extension}`;
    const type = answer.headers.get('Content-Type') ?? 'application/octet-stream';
    const view = this.page.defaultView!;
    const url = view.URL.createObjectURL(new Blob([answer.body ?? ''], { type }));
    const link = this.page.createElement('a');
    link.href = url;
    link.download = name;
    link.style.display = 'none';
    this.page.body.appendChild(link);
    link.click();
    link.remove();
    // Revoke after the click has been handled, or some browsers cancel the download.
    view.setTimeout(() => view.URL.revokeObjectURL(url), 0);
    return name;
  }
}

/** The error with its text body read as the API's JSON error, when it is one. */
function withJsonBody(error: HttpErrorResponse): HttpErrorResponse {
  if (typeof error.error !== 'string') return error;
  try {
    return new HttpErrorResponse({
      error: JSON.parse(error.error),
      headers: error.headers,
      status: error.status,
      statusText: error.statusText,
      url: error.url ?? undefined,
    });
  } catch {
    return error;
  }
}
