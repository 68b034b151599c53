import { inject } from '@angular/core';
import type { CanDeactivateFn } from '@angular/router';
import { Ask } from '../../core/dialogs/ask';

/** A page that may hold edits not yet saved. */
export interface LeaveAware {
  /** Whether leaving now would drop unsaved edits. */
  hasUnsavedEdits(): boolean;
}

/**
 * Asks before leaving a chain with unsaved edits. The edits also sit in a local draft,
 * so even "leave" loses nothing on this browser; the question is about the server copy.
 * (Closing the tab or reloading is asked by the browser itself, through `beforeunload`.)
 */
export const editorLeaveGuard: CanDeactivateFn<LeaveAware> = (page) => {
  if (!page?.hasUnsavedEdits()) return true;
  return inject(Ask).confirm({
    title: 'Leave without saving?',
    message:
      'This chain has edits that are not saved. A draft of them stays on this browser, ' +
      'and the chain offers it when you open it again.',
    confirmLabel: 'Leave',
    cancelLabel: 'Stay',
    tone: 'plain',
  });
};
