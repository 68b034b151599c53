import { HttpContextToken } from '@angular/common/http';

/**
 * Tells the error interceptor not to show its snackbar for a request whose errors the
 * caller handles itself. `true` skips every status; a list skips only those statuses,
 * e.g. `new HttpContext().set(SKIP_ERROR_SNACKBAR, [409, 422])`.
 */
export const SKIP_ERROR_SNACKBAR = new HttpContextToken<boolean | readonly number[]>(() => false);

/** Whether the loading bar should ignore a request (background polling, for instance). */
export const SKIP_LOADING_BAR = new HttpContextToken<boolean>(() => false);

/** Whether the error interceptor skips the snackbar for this status under this setting. */
export function isSnackbarSkipped(setting: boolean | readonly number[], status: number): boolean {
  return setting === true || (Array.isArray(setting) && setting.includes(status));
}
