import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { StageTypeInfo } from '../../../../shared/engine/types';
import type {
  AcceptedInvitationDto,
  ActivityDto,
  CaughtMailDto,
  CaughtMailSummaryDto,
  CommentDto,
  InvitationDto,
  InvitationPreviewDto,
  MailOutcomeDto,
  OutboxMessageDto,
  RevisionDiffDto,
  SharedChainDto,
  ShareLinkDto,
  SignedInDto,
  WorkspaceRole,
} from '../../../../shared/schema/api';

const enc = encodeURIComponent;

/**
 * Working with colleagues: invitations, password links, read-only links, comments,
 * activity, revision differences and the admin's mail pages.
 */
@Injectable({ providedIn: 'root' })
export class ColleaguesApi {
  private readonly http = inject(HttpClient);

  // ---------------------------------------------------------------- invitations
  invitations(workspaceId: string): Observable<InvitationDto[]> {
    return this.http.get<InvitationDto[]>(`/api/workspaces/${enc(workspaceId)}/invitations`);
  }
  invite(
    workspaceId: string,
    email: string,
    role: WorkspaceRole,
    context?: HttpContext,
  ): Observable<InvitationDto> {
    return this.http.post<InvitationDto>(
      `/api/workspaces/${enc(workspaceId)}/invitations`,
      { email, role },
      { context },
    );
  }
  revokeInvitation(workspaceId: string, id: string): Observable<unknown> {
    return this.http.delete(`/api/workspaces/${enc(workspaceId)}/invitations/${enc(id)}`);
  }
  previewInvitation(token: string, context?: HttpContext): Observable<InvitationPreviewDto> {
    return this.http.get<InvitationPreviewDto>(`/api/invitations/${enc(token)}`, { context });
  }
  acceptInvitation(
    token: string,
    body: { displayName?: string; password?: string },
    context?: HttpContext,
  ): Observable<AcceptedInvitationDto> {
    return this.http.post<AcceptedInvitationDto>(`/api/invitations/${enc(token)}/accept`, body, {
      context,
    });
  }

  // ---------------------------------------------------------------- passwords, sign-up
  requestPasswordReset(email: string, context?: HttpContext): Observable<{ message: string }> {
    return this.http.post<{ message: string }>('/api/auth/password-reset', { email }, { context });
  }
  resetPassword(token: string, password: string, context?: HttpContext): Observable<unknown> {
    return this.http.post(`/api/auth/password-reset/${enc(token)}`, { password }, { context });
  }
  confirmAddress(token: string, context?: HttpContext): Observable<SignedInDto> {
    return this.http.post<SignedInDto>(`/api/auth/confirm/${enc(token)}`, {}, { context });
  }

  // ---------------------------------------------------------------- sharing
  shareLinks(chainId: string): Observable<ShareLinkDto[]> {
    return this.http.get<ShareLinkDto[]>(`/api/chains/${enc(chainId)}/share-links`);
  }
  createShareLink(chainId: string, expiresInDays?: number): Observable<ShareLinkDto> {
    return this.http.post<ShareLinkDto>(
      `/api/chains/${enc(chainId)}/share-links`,
      expiresInDays ? { expiresInDays } : {},
    );
  }
  revokeShareLink(chainId: string, linkId: string): Observable<unknown> {
    return this.http.delete(`/api/chains/${enc(chainId)}/share-links/${enc(linkId)}`);
  }
  /** A shared chain and its analyses; `figures`: the significant figures of the flag sentences. */
  shared(token: string, context?: HttpContext, figures?: number): Observable<SharedChainDto> {
    const params = figures ? { figures } : undefined;
    return this.http.get<SharedChainDto>(`/api/shared/${enc(token)}`, { context, params });
  }
  /** The catalogue entries of a shared chain's stage types (names and units), signed out too. */
  sharedCatalogue(token: string, context?: HttpContext): Observable<StageTypeInfo[]> {
    return this.http.get<StageTypeInfo[]>(`/api/shared/${enc(token)}/catalogue`, { context });
  }
  sendChain(chainId: string, email: string, note: string): Observable<{ mail: MailOutcomeDto }> {
    return this.http.post<{ mail: MailOutcomeDto }>(`/api/chains/${enc(chainId)}/send`, {
      email,
      note,
    });
  }

  // ---------------------------------------------------------------- comments, activity, diff
  comments(chainId: string): Observable<CommentDto[]> {
    return this.http.get<CommentDto[]>(`/api/chains/${enc(chainId)}/comments`);
  }
  addComment(chainId: string, body: string, stageId: string | null): Observable<CommentDto> {
    return this.http.post<CommentDto>(`/api/chains/${enc(chainId)}/comments`, {
      body,
      ...(stageId ? { stageId } : {}),
    });
  }
  editComment(chainId: string, id: string, body: string): Observable<CommentDto> {
    return this.http.patch<CommentDto>(`/api/chains/${enc(chainId)}/comments/${enc(id)}`, {
      body,
    });
  }
  deleteComment(chainId: string, id: string): Observable<unknown> {
    return this.http.delete(`/api/chains/${enc(chainId)}/comments/${enc(id)}`);
  }
  activity(workspaceId: string, before?: string): Observable<ActivityDto[]> {
    const query = before ? `?before=${enc(before)}` : '';
    return this.http.get<ActivityDto[]>(`/api/workspaces/${enc(workspaceId)}/activity${query}`);
  }
  /** What changed between two revisions; `figures`: the significant figures of its texts. */
  diff(chainId: string, from: number, to: number, figures?: number): Observable<RevisionDiffDto> {
    const params: Record<string, number> = figures ? { from, to, figures } : { from, to };
    return this.http.get<RevisionDiffDto>(`/api/chains/${enc(chainId)}/diff`, { params });
  }

  // ---------------------------------------------------------------- admin's mail pages
  mailbox(context?: HttpContext): Observable<CaughtMailSummaryDto[]> {
    return this.http.get<CaughtMailSummaryDto[]>('/api/admin/mailbox', { context });
  }
  caughtMail(id: string): Observable<CaughtMailDto> {
    return this.http.get<CaughtMailDto>(`/api/admin/mailbox/${enc(id)}`);
  }
  outbox(): Observable<OutboxMessageDto[]> {
    return this.http.get<OutboxMessageDto[]>('/api/admin/outbox');
  }
  retryMail(id: string): Observable<MailOutcomeDto> {
    return this.http.post<MailOutcomeDto>(`/api/admin/outbox/${enc(id)}/retry`, {});
  }
}
