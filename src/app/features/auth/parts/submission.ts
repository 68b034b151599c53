import { signal } from '@angular/core';
import { describeHttpError } from '../../../core/http/error-message';

/**
 * The state of a form's one submit action: busy while it runs (a second click does
 * nothing), and the failure to show in the form, in words, when it fails.
 */
export class Submission {
  readonly busy = signal(false);
  readonly failure = signal('');

  /**
   * Runs `work` unless a run is under way. A failure is shown (its words from the server's
   * answer) unless `onError` takes it and returns true.
   */
  async run(work: () => Promise<void>, onError?: (error: unknown) => boolean): Promise<void> {
    if (this.busy()) return;
    this.busy.set(true);
    this.failure.set('');
    try {
      await work();
    } catch (error) {
      if (!onError?.(error)) this.failure.set(describeHttpError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
