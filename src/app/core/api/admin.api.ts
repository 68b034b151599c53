import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { z } from 'zod';
import type {
  AccountDeletedDto,
  AdminUserDto,
  siteSettingsSchema,
  UserDto,
} from '../../../../shared/schema/api';

export type SiteSettings = z.infer<typeof siteSettingsSchema>;

/**
 * A user row of the admin list: the account and its state. Fields beyond UserDto are
 * optional so an older server's rows still show.
 */
export type AdminUserRow = UserDto & Partial<Omit<AdminUserDto, keyof UserDto>>;

/** Site administration: /api/admin/*. */
@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  users(): Observable<AdminUserRow[]> {
    return this.http.get<AdminUserRow[]>('/api/admin/users');
  }

  /** Deactivates (`false`) or reactivates (`true`) an account. */
  setActive(userId: string, active: boolean): Observable<AdminUserDto> {
    return this.http.patch<AdminUserDto>(`/api/admin/users/${userId}`, { active });
  }

  /** Deletes an account; says which workspaces went with it and which it left. */
  deleteUser(userId: string): Observable<AccountDeletedDto> {
    return this.http.delete<AccountDeletedDto>(`/api/admin/users/${userId}`);
  }

  settings(): Observable<SiteSettings> {
    return this.http.get<SiteSettings>('/api/admin/settings');
  }

  updateSettings(settings: SiteSettings): Observable<SiteSettings> {
    return this.http.patch<SiteSettings>('/api/admin/settings', settings);
  }
}
