import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { DataFileDto, DataFileSummaryDto } from '../../../../shared/schema/api';
import { SKIP_ERROR_SNACKBAR } from '../http/http-context';

/** A workspace's measured data files: /api/workspaces/:wid/files. */
@Injectable({ providedIn: 'root' })
export class DataFilesApi {
  private readonly http = inject(HttpClient);

  list(workspaceId: string): Observable<DataFileSummaryDto[]> {
    return this.http.get<DataFileSummaryDto[]>(`/api/workspaces/${enc(workspaceId)}/files`);
  }

  /** Sends a Touchstone file as text; a file the reader refuses answers 422 naming the line. */
  upload(workspaceId: string, name: string, content: string): Observable<DataFileDto> {
    // The field shows the reader's refusal next to the select, so no snackbar for it.
    return this.http.post<DataFileDto>(
      `/api/workspaces/${enc(workspaceId)}/files`,
      { name, content },
      { context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [422]) },
    );
  }

  remove(workspaceId: string, fileId: string): Observable<unknown> {
    return this.http.delete(`/api/workspaces/${enc(workspaceId)}/files/${enc(fileId)}`);
  }
}

const enc = encodeURIComponent;
