/** Ways into the comparison: the family of a chain, and the query string that shows it. */
import { HttpContext } from '@angular/common/http';
import { inject, type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { catchError, of, switchMap } from 'rxjs';
import type { ChainSummaryDto } from '../../../../shared/schema/api';
import { ChainsApi } from '../../core/api/chains.api';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { MAX_COMPARED } from './compare-ids';

/**
 * The family of the chain `chainId` names, reloaded when it changes ([] while loading or
 * when it cannot be read: the entry point then stays hidden, nothing is reported).
 * Call in an injection context.
 */
export function familyOf(chainId: Signal<string>): Signal<ChainSummaryDto[]> {
  const api = inject(ChainsApi);
  const quiet = new HttpContext().set(SKIP_ERROR_SNACKBAR, true);
  return toSignal(
    toObservable(chainId).pipe(
      switchMap((id) => api.family(id, quiet).pipe(catchError(() => of<ChainSummaryDto[]>([])))),
    ),
    { initialValue: [] },
  );
}

/**
 * Query parameters comparing `chainId` with its relatives (family order, at most six, the
 * chain itself always among them); null when the family has fewer than two members.
 */
export function compareQueryOf(
  family: ChainSummaryDto[],
  chainId: string,
): { chains: string } | null {
  if (family.length < 2) return null;
  const ids = family.map((c) => c.id);
  const others = ids.filter((id) => id !== chainId).slice(0, MAX_COMPARED - 1);
  const chosen = new Set([chainId, ...others]);
  return { chains: ids.filter((id) => chosen.has(id)).join(',') };
}

/** Whether a chain-list row belongs to a family: it is a variant or has variants. */
export function inFamily(chain: Pick<ChainSummaryDto, 'parentId' | 'variantCount'>): boolean {
  return chain.parentId !== null || (chain.variantCount ?? 0) > 0;
}
