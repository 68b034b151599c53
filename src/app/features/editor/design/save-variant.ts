import type { Injector } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { ChainDto } from '../../../../../shared/schema/api';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import { ChainsApi } from '../../../core/api/chains.api';
import { Ask } from '../../../core/dialogs/ask';
import { variantNameQuestion } from '../../chains/variant-name';
import { describeHttpError } from '../../../core/http/error-message';
import { clearDrafts } from '../state/draft-store';
import { EditorStore } from '../state/editor.store';

/**
 * Saves `document` as a named variant of `chain` (a linked copy the chain list shows under
 * its parent and the comparison offers) and opens it. Unsaved edits go with the variant;
 * the parent returns to its stored state. The name is asked for in a dialog; cancelling
 * saves nothing.
 */
export async function saveAsVariant(
  injector: Injector,
  chain: ChainDto,
  document: ChainDocument,
): Promise<boolean> {
  const snackBar = injector.get(MatSnackBar);
  const name = await injector.get(Ask).name(variantNameQuestion(document.name));
  if (!name) return false;
  try {
    const variant = await firstValueFrom(
      injector.get(ChainsApi).duplicate(chain.id, { name, asVariant: true, document }),
    );
    // The variant holds the edits now: the parent goes back to its stored state.
    clearDrafts(chain.id);
    injector.get(EditorStore).load(chain);
    snackBar.open(`Saved as the variant “${variant.name}”.`, undefined, { duration: 4000 });
    await injector.get(Router).navigate(['/w', variant.workspaceId, 'chains', variant.id]);
    return true;
  } catch (e) {
    snackBar.open(`The variant was not saved: ${describeHttpError(e)}`, 'OK');
    return false;
  }
}
