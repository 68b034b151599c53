import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type {
  CoilForm,
  MatchHereRequest,
  MatchHereResult,
  PartRow,
  PreferredSeries,
  ResonatorRef,
  SnapResult,
  TuneCandidate,
  TuneResult,
} from '../../../../../shared/engine/design';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import { significantFigures } from '../../../core/format/number-format';
import { SKIP_ERROR_SNACKBAR } from '../../../core/http/http-context';

/** The design assistants' endpoints; refusals (422) are shown in the panel, not a snackbar. */
@Injectable({ providedIn: 'root' })
export class DesignApi {
  private readonly http = inject(HttpClient);
  private readonly quiet = { context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [422]) };

  // Every answer's texts come written at the user's significant figures.
  private post<T>(path: string, body: object): Observable<T> {
    const figures = significantFigures();
    return this.http.post<T>(`/api/design/${path}`, { ...body, figures }, this.quiet);
  }

  tuneCandidates(document: ChainDocument, resonator: ResonatorRef, workspaceId?: string) {
    return this.post<TuneCandidate[]>('tune/candidates', { document, resonator, workspaceId });
  }

  tune(
    document: ChainDocument,
    body: {
      resonator: ResonatorRef;
      element: { stageId: string; key: string };
      targetHz: number;
      peakNode?: number;
    },
    workspaceId?: string,
  ) {
    return this.post<TuneResult>('tune', { document, workspaceId, ...body });
  }

  matchHere(
    document: ChainDocument,
    body: Omit<MatchHereRequest, 'partsQ'> & { partsQ?: { ql?: number; qc?: number } },
    workspaceId?: string,
  ) {
    return this.post<MatchHereResult>('match-here', { document, workspaceId, ...body });
  }

  snap(document: ChainDocument, series: PreferredSeries, stageId?: string, workspaceId?: string) {
    return this.post<SnapResult>('snap', { document, workspaceId, series, stageId });
  }

  parts(document: ChainDocument, stageId: string, coilForm: CoilForm, workspaceId?: string) {
    return this.post<{ stageId: string; rows: PartRow[]; csv: string }>('parts', {
      document,
      workspaceId,
      stageId,
      coilForm,
    });
  }
}
