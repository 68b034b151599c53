import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable, shareReplay } from 'rxjs';
import type { AnalysisResult, StageTypeInfo } from '../../../../../shared/engine/types';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import {
  analysisFromDto,
  PLOTTED_TRACES,
  type AnalysisDto,
} from '../../../../../shared/schema/sweep-columns';
import { SKIP_ERROR_SNACKBAR } from '../../../core/http/http-context';

/** The stage catalogue and the analysis endpoint. */
@Injectable({ providedIn: 'root' })
export class AnalysisApi {
  private readonly http = inject(HttpClient);
  // The catalogue changes only with a deploy: fetch it once per page load.
  private readonly catalogue$ = this.http
    .get<StageTypeInfo[]>('/api/catalogue')
    .pipe(shareReplay({ bufferSize: 1, refCount: false }));

  catalogue(): Observable<StageTypeInfo[]> {
    return this.catalogue$;
  }

  /**
   * The analysis with the sweep traces the plots draw (the server sends them in columns; the
   * node phases stay on the server). The editor shows a refused chain (422) in its own
   * banner, so no snackbar for it. Without `mode`, send a document without modes to get
   * the chain as written. `figures`: the significant figures of the flag sentences.
   */
  analyse(
    document: ChainDocument,
    workspaceId?: string,
    mode?: string,
    figures?: number,
  ): Observable<AnalysisResult> {
    // The workspace lets the server find the data files the stages refer to; the server
    // applies the mode named (its values, the stages it leaves out, its path).
    return this.http
      .post<AnalysisDto>(
        '/api/analysis',
        {
          document,
          sweep: true,
          traces: PLOTTED_TRACES,
          // A third of the bytes on the wire; analysisFromDto reads the same values back.
          sweepPacking: 'differences',
          ...(workspaceId ? { workspaceId } : {}),
          ...(mode ? { mode } : {}),
          // The flag sentences are written on the server: at the user's figures, like the rest.
          ...(figures ? { figures } : {}),
        },
        { context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [422]) },
      )
      .pipe(map(analysisFromDto));
  }
}
