import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { z } from 'zod';
import type { siteSettingsSchema, UserDto } from '../../../../shared/schema/api';

export type SiteSettings = z.infer<typeof siteSettingsSchema>;

/**
 * A user row of the admin list. The contract names only UserDto; the server may add
 * fields such as a creation date, shown when present.
 */
export interface AdminUserRow extends UserDto {
  createdAt?: string;
}

/** Site administration: /api/admin/*. */
@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  users(): Observable<AdminUserRow[]> {
    return this.http.get<AdminUserRow[]>('/api/admin/users');
  }

  settings(): Observable<SiteSettings> {
    return this.http.get<SiteSettings>('/api/admin/settings');
  }

  updateSettings(settings: SiteSettings): Observable<SiteSettings> {
    return this.http.patch<SiteSettings>('/api/admin/settings', settings);
  }
}
