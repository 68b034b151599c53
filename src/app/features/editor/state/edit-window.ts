/**
 * When an edit goes to the server. The rule: an edit made after a quiet spell of `quietMs`
 * (no edit in that time) goes at once; edits that follow one another closer than `quietMs`
 * are gathered, and the latest goes once they pause for `quietMs`. So a value typed key by
 * key (keys come ~100–200 ms apart) is analysed at every key without waiting, while a burst
 * (a held key, a paste, a drag's many steps) sends nothing until it ends, and the screen is
 * not redrawn under the person's fingers for values already replaced.
 */
import { Observable, type MonoTypeOperatorFunction } from 'rxjs';

export function sendAfterQuiet<T>(quietMs: number): MonoTypeOperatorFunction<T> {
  return (source) =>
    new Observable<T>((subscriber) => {
      let timer: ReturnType<typeof setTimeout> | null = null;
      let gathered: { value: T } | null = null;
      // The window closes `quietMs` after the latest edit; a gathered edit goes then and
      // opens a window of its own, so an edit right after it is gathered in turn.
      const close = () => {
        timer = null;
        if (!gathered) return;
        const { value } = gathered;
        gathered = null;
        timer = setTimeout(close, quietMs);
        subscriber.next(value);
      };
      const subscription = source.subscribe({
        next: (value) => {
          const quiet = timer === null;
          if (timer !== null) clearTimeout(timer);
          timer = setTimeout(close, quietMs);
          if (quiet) subscriber.next(value);
          else gathered = { value };
        },
        error: (error: unknown) => subscriber.error(error),
        complete: () => {
          if (timer !== null) clearTimeout(timer);
          if (gathered) subscriber.next(gathered.value);
          subscriber.complete();
        },
      });
      return () => {
        if (timer !== null) clearTimeout(timer);
        subscription.unsubscribe();
      };
    });
}
