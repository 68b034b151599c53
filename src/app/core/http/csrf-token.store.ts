import { HttpBackend, HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';

/**
 * Holds the CSRF token of the current session. The token changes whenever the session
 * does (sign-in, registration, sign-out), so callers set or clear it at those moments and
 * the next state-changing request fetches a fresh one if none is held.
 */
@Injectable({ providedIn: 'root' })
export class CsrfTokenStore {
  // A client without interceptors: fetching the token must not recurse into the CSRF
  // interceptor, and a failure here is reported by the request that needed the token.
  private readonly bareHttp = new HttpClient(inject(HttpBackend));
  private token: string | null = null;
  private pending: Promise<string> | null = null;

  /** The token held now, or null when the next request must fetch one. */
  held(): string | null {
    return this.token;
  }

  /** The held token, or a fresh one from GET /api/auth/csrf. */
  async get(): Promise<string> {
    if (this.token) return this.token;
    this.pending ??= firstValueFrom(this.bareHttp.get<{ token: string }>('/api/auth/csrf'))
      .then((answer) => {
        this.token = answer.token;
        return answer.token;
      })
      .finally(() => (this.pending = null));
    return this.pending;
  }

  /** Keeps the token a sign-in or registration answer carried. */
  set(token: string): void {
    this.token = token;
  }

  /** Forgets the token (after sign-out, or when the server rejected it). */
  clear(): void {
    this.token = null;
  }
}
