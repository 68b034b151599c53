import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { ChainDto } from '../../../../shared/schema/api';
import type { ChainDocument } from '../../../../shared/schema/chain';
import type { StudyDto, StudySpecInput, StudySummaryDto } from '../../../../shared/schema/studies';

const enc = encodeURIComponent;

/** Studies of a chain: start, list, read, cancel, follow. */
@Injectable({ providedIn: 'root' })
export class StudiesApi {
  private readonly http = inject(HttpClient);

  list(chainId: string): Observable<StudySummaryDto[]> {
    return this.http.get<StudySummaryDto[]>(`/api/chains/${enc(chainId)}/studies`);
  }

  get(chainId: string, id: string): Observable<StudyDto> {
    return this.http.get<StudyDto>(`/api/chains/${enc(chainId)}/studies/${enc(id)}`);
  }

  start(chainId: string, spec: StudySpecInput): Observable<StudyDto> {
    return this.http.post<StudyDto>(`/api/chains/${enc(chainId)}/studies`, spec);
  }

  cancel(chainId: string, id: string): Observable<StudyDto> {
    return this.http.post<StudyDto>(`/api/chains/${enc(chainId)}/studies/${enc(id)}/cancel`, {});
  }

  /** Keeps the optimised document as a variant of the chain. */
  saveVariant(chainId: string, document: ChainDocument, name: string): Observable<ChainDto> {
    return this.http.post<ChainDto>(`/api/chains/${enc(chainId)}/duplicate`, {
      asVariant: true,
      name,
      document: { ...document, name },
    });
  }

  /**
   * Follows a study: server-sent events where the browser has them, else polling every
   * second. Emits the study as it changes and completes after its end.
   */
  follow(chainId: string, id: string): Observable<StudySummaryDto | StudyDto> {
    return new Observable((sub) => {
      const url = `/api/chains/${enc(chainId)}/studies/${enc(id)}`;
      let timer: ReturnType<typeof setInterval> | undefined;
      const poll = () => {
        timer = setInterval(() => {
          this.get(chainId, id).subscribe({
            next: (s) => {
              sub.next(s);
              if (['done', 'failed', 'cancelled'].includes(s.status)) sub.complete();
            },
            error: (e) => sub.error(e),
          });
        }, 1000);
      };
      if (typeof EventSource === 'undefined') {
        poll();
        return () => clearInterval(timer);
      }
      const source = new EventSource(`${url}/events`);
      source.addEventListener('progress', (e) => sub.next(JSON.parse((e as MessageEvent).data)));
      source.addEventListener('end', (e) => {
        const data = JSON.parse((e as MessageEvent).data);
        if (data) sub.next(data);
        source.close();
        sub.complete();
      });
      source.onerror = () => {
        // The stream broke (a proxy, a restart): fall back to polling.
        source.close();
        if (!timer) poll();
      };
      return () => {
        source.close();
        clearInterval(timer);
      };
    });
  }
}
