import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type {
  PartDto,
  PartsImportDto,
  PartsPreviewDto,
  PartsUploadBody,
} from '../../../../shared/schema/api';
import { SKIP_ERROR_SNACKBAR } from '../http/http-context';

/** A workspace's parts bin: /api/workspaces/:wid/parts. */
@Injectable({ providedIn: 'root' })
export class PartsApi {
  private readonly http = inject(HttpClient);

  list(workspaceId: string): Observable<PartDto[]> {
    return this.http.get<PartDto[]>(`/api/workspaces/${enc(workspaceId)}/parts`);
  }

  /** The list as it would be read; the page shows refusals (413/422) beside the upload. */
  preview(workspaceId: string, body: PartsUploadBody): Observable<PartsPreviewDto> {
    return this.http.post<PartsPreviewDto>(
      `/api/workspaces/${enc(workspaceId)}/parts/preview`,
      body,
      {
        context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [413, 422]),
      },
    );
  }

  import(workspaceId: string, body: PartsUploadBody): Observable<PartsImportDto> {
    return this.http.post<PartsImportDto>(
      `/api/workspaces/${enc(workspaceId)}/parts/import`,
      body,
      {
        context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [413, 422]),
      },
    );
  }

  remove(workspaceId: string, partId: string): Observable<unknown> {
    return this.http.delete(`/api/workspaces/${enc(workspaceId)}/parts/${enc(partId)}`);
  }
}

const enc = encodeURIComponent;
