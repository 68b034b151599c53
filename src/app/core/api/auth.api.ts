import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { z } from 'zod';
import type {
  changePasswordSchema,
  loginSchema,
  MeDto,
  registerSchema,
  RegistrationPendingDto,
  SignedInDto,
} from '../../../../shared/schema/api';

export type RegisterBody = z.input<typeof registerSchema>;
export type LoginBody = z.input<typeof loginSchema>;
export type ChangePasswordBody = z.input<typeof changePasswordSchema>;

/** Accounts and sessions: /api/auth/* and /api/me. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  /** Signs the first account of a site in at once; later ones wait for their address (202). */
  register(
    body: RegisterBody,
    context?: HttpContext,
  ): Observable<SignedInDto | RegistrationPendingDto> {
    return this.http.post<SignedInDto | RegistrationPendingDto>('/api/auth/register', body, {
      context,
    });
  }

  login(body: LoginBody, context?: HttpContext): Observable<SignedInDto> {
    return this.http.post<SignedInDto>('/api/auth/login', body, { context });
  }

  logout(): Observable<unknown> {
    return this.http.post('/api/auth/logout', {});
  }

  changePassword(body: ChangePasswordBody, context?: HttpContext): Observable<unknown> {
    return this.http.post('/api/auth/password', body, { context });
  }

  /** Whether anyone may create an account (public; the register page asks first). */
  registration(context?: HttpContext): Observable<{ openRegistration: boolean }> {
    return this.http.get<{ openRegistration: boolean }>('/api/auth/registration', { context });
  }

  me(context?: HttpContext): Observable<MeDto> {
    return this.http.get<MeDto>('/api/me', { context });
  }
}
