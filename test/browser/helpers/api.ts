/** The app's API called as the signed-in user of a page (its session cookie and CSRF token). */
import type { Page } from 'playwright-core';
import type { AnalysisResult } from '../../../shared/engine/types';
import type { ChainDto } from '../../../shared/schema/api';

export async function api<T>(
  page: Page,
  method: 'get' | 'post' | 'delete',
  url: string,
  data?: unknown,
): Promise<T> {
  const { token } = (await (await page.request.get('/api/auth/csrf')).json()) as { token: string };
  const res = await page.request.fetch(url, { method, data, headers: { 'x-csrf-token': token } });
  if (!res.ok()) throw new Error(`${method} ${url}: ${res.status()} ${await res.text()}`);
  // A delete answers 204 with no body.
  return (res.status() === 204 ? undefined : await res.json()) as T;
}

/** The app's significant figures when the user has chosen none (the demo accounts keep it). */
export const DEFAULT_FIGURES = 4;

/**
 * The saved chain and its analysis (with the sweep), asked of the API on its own. The flag
 * sentences are written at `figures` significant figures, as the app asks for them at the
 * user's setting.
 */
export async function savedAnalysis(
  page: Page,
  chainId: string,
  figures = DEFAULT_FIGURES,
): Promise<{ chain: ChainDto; analysis: AnalysisResult }> {
  const chain = await api<ChainDto>(page, 'get', `/api/chains/${chainId}`);
  const analysis = await api<AnalysisResult>(page, 'post', '/api/analysis', {
    document: chain.document,
    sweep: true,
    workspaceId: chain.workspaceId,
    figures,
  });
  return { chain, analysis };
}
