import type { CanDeactivateFn } from '@angular/router';

/** A page that may hold edits not yet saved. */
export interface LeaveAware {
  /** Whether leaving now would drop unsaved edits. */
  hasUnsavedEdits(): boolean;
}

/**
 * Asks before leaving a chain with unsaved edits. The edits also sit in a local draft,
 * so even "leave" loses nothing on this browser; the question is about the server copy.
 */
export const editorLeaveGuard: CanDeactivateFn<LeaveAware> = (page) =>
  !page?.hasUnsavedEdits() ||
  window.confirm(
    'This chain has edits that are not saved. Leave anyway? (A local draft is kept on this browser.)',
  );
