import { HttpClient, HttpContext, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';
import type { z } from 'zod';
import type { AnalysisResult } from '../../../../shared/engine/types';
import { analysisFromDto, type AnalysisDto } from '../../../../shared/schema/sweep-columns';
import type {
  ChainDto,
  ChainImportDto,
  ChainFamilyDto,
  ChainListDto,
  createChainSchema,
  duplicateChainSchema,
  ExampleDto,
  listChainsQuerySchema,
  RevisionDto,
  RevisionSummaryDto,
  updateChainSchema,
} from '../../../../shared/schema/api';

export type ChainListQuery = Partial<z.input<typeof listChainsQuerySchema>>;
export type CreateChainBody = z.input<typeof createChainSchema>;
export type UpdateChainBody = z.input<typeof updateChainSchema>;
export type DuplicateChainBody = z.input<typeof duplicateChainSchema>;

/** Chains, their revisions, and the examples a chain can start from. */
@Injectable({ providedIn: 'root' })
export class ChainsApi {
  private readonly http = inject(HttpClient);

  list(workspaceId: string, query: ChainListQuery = {}): Observable<ChainListDto> {
    let params = new HttpParams();
    for (const [key, value] of Object.entries(query)) {
      // An empty filter means "no filter": leave it out rather than send q=.
      if (value !== undefined && value !== '') params = params.set(key, String(value));
    }
    return this.http.get<ChainListDto>(`/api/workspaces/${enc(workspaceId)}/chains`, { params });
  }

  create(workspaceId: string, body: CreateChainBody, context?: HttpContext): Observable<ChainDto> {
    return this.http.post<ChainDto>(`/api/workspaces/${enc(workspaceId)}/chains`, body, {
      context,
    });
  }

  /** Imports an exported chain file's text; refusals (413/422) name the line or field. */
  importFile(
    workspaceId: string,
    text: string,
    fileName: string,
    context?: HttpContext,
  ): Observable<ChainImportDto> {
    return this.http.post<ChainImportDto>(
      `/api/workspaces/${enc(workspaceId)}/chains/import`,
      { text, fileName },
      { context },
    );
  }

  get(chainId: string, context?: HttpContext): Observable<ChainDto> {
    return this.http.get<ChainDto>(`/api/chains/${enc(chainId)}`, { context });
  }

  update(chainId: string, body: UpdateChainBody, context?: HttpContext): Observable<ChainDto> {
    return this.http.put<ChainDto>(`/api/chains/${enc(chainId)}`, body, { context });
  }

  delete(chainId: string): Observable<unknown> {
    return this.http.delete(`/api/chains/${enc(chainId)}`);
  }

  duplicate(
    chainId: string,
    body: DuplicateChainBody = {},
    context?: HttpContext,
  ): Observable<ChainDto> {
    return this.http.post<ChainDto>(`/api/chains/${enc(chainId)}/duplicate`, body, { context });
  }

  /** The chain's family: its root first, then every variant below it. */
  family(chainId: string, context?: HttpContext): Observable<ChainFamilyDto> {
    return this.http.get<ChainFamilyDto>(`/api/chains/${enc(chainId)}/family`, { context });
  }

  /**
   * The stored chain's analysis, with the plotted sweep traces (sent in columns) and the
   * receiver plan's figures.
   */
  /** The stored chain's analysis, in `mode` when given (else its first mode, if it has modes). */
  analysis(chainId: string, context?: HttpContext, mode?: string): Observable<AnalysisResult> {
    return this.http
      .get<AnalysisDto>(`/api/chains/${enc(chainId)}/analysis`, {
        // The differences packing: a third of the bytes, read back to the same values.
        params: { sweep: '1', plan: '1', packing: 'differences', ...(mode ? { mode } : {}) },
        context,
      })
      .pipe(map(analysisFromDto));
  }

  revisions(chainId: string): Observable<RevisionSummaryDto[]> {
    return this.http.get<RevisionSummaryDto[]>(`/api/chains/${enc(chainId)}/revisions`);
  }

  revision(chainId: string, version: number): Observable<RevisionDto> {
    return this.http.get<RevisionDto>(`/api/chains/${enc(chainId)}/revisions/${version}`);
  }

  /**
   * Restores revision `revision` as a new revision. `currentVersion` is the chain version
   * the caller last read: a stale one is refused with 409, as a save is.
   */
  restore(
    chainId: string,
    revision: number,
    currentVersion: number,
    context?: HttpContext,
  ): Observable<ChainDto> {
    return this.http.post<ChainDto>(
      `/api/chains/${enc(chainId)}/revisions/${revision}/restore`,
      { version: currentVersion },
      { context },
    );
  }

  /** The stage catalogue, unparsed: callers validate the parts they rely on. */
  catalogue(): Observable<unknown> {
    return this.http.get<unknown>('/api/catalogue');
  }

  examples(): Observable<ExampleDto[]> {
    return this.http.get<ExampleDto[]>('/api/examples');
  }
}

const enc = encodeURIComponent;
