import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { MemberDto, WorkspaceDto, WorkspaceRole } from '../../../../shared/schema/api';

/** Workspaces and their members: /api/workspaces/*. */
@Injectable({ providedIn: 'root' })
export class WorkspacesApi {
  private readonly http = inject(HttpClient);

  list(): Observable<WorkspaceDto[]> {
    return this.http.get<WorkspaceDto[]>('/api/workspaces');
  }

  create(name: string, context?: HttpContext): Observable<WorkspaceDto> {
    return this.http.post<WorkspaceDto>('/api/workspaces', { name }, { context });
  }

  rename(workspaceId: string, name: string): Observable<WorkspaceDto> {
    return this.http.patch<WorkspaceDto>(`/api/workspaces/${enc(workspaceId)}`, { name });
  }

  members(workspaceId: string): Observable<MemberDto[]> {
    return this.http.get<MemberDto[]>(`/api/workspaces/${enc(workspaceId)}/members`);
  }

  addMember(
    workspaceId: string,
    email: string,
    role: WorkspaceRole,
    context?: HttpContext,
  ): Observable<MemberDto> {
    return this.http.post<MemberDto>(
      `/api/workspaces/${enc(workspaceId)}/members`,
      { email, role },
      { context },
    );
  }

  changeRole(workspaceId: string, userId: string, role: WorkspaceRole): Observable<MemberDto> {
    return this.http.patch<MemberDto>(
      `/api/workspaces/${enc(workspaceId)}/members/${enc(userId)}`,
      { role },
    );
  }

  removeMember(workspaceId: string, userId: string): Observable<unknown> {
    return this.http.delete(`/api/workspaces/${enc(workspaceId)}/members/${enc(userId)}`);
  }
}

const enc = encodeURIComponent;
