import { Subject } from 'rxjs';
import { sendAfterQuiet } from './edit-window';

describe('sendAfterQuiet', () => {
  const QUIET = 50;
  let edits: Subject<string>;
  let sent: string[];

  beforeEach(() => {
    jest.useFakeTimers();
    edits = new Subject<string>();
    sent = [];
    edits.pipe(sendAfterQuiet(QUIET)).subscribe((v) => sent.push(v));
  });

  afterEach(() => jest.useRealTimers());

  it('should send an edit after a quiet spell at once', () => {
    edits.next('a');
    expect(sent).toEqual(['a']);
    jest.advanceTimersByTime(QUIET);
    edits.next('b');
    expect(sent).toEqual(['a', 'b']);
  });

  it('should send every key of a value typed at a person’s pace, each at once', () => {
    for (const key of ['1', '12', '120']) {
      edits.next(key);
      expect(sent.at(-1)).toBe(key);
      jest.advanceTimersByTime(120);
    }
    expect(sent).toEqual(['1', '12', '120']);
  });

  it('should gather a burst and send its latest edit once the burst pauses', () => {
    edits.next('a');
    jest.advanceTimersByTime(QUIET - 10);
    edits.next('b');
    jest.advanceTimersByTime(QUIET - 10);
    edits.next('c');
    jest.advanceTimersByTime(QUIET - 1);
    expect(sent).toEqual(['a']);
    jest.advanceTimersByTime(1);
    expect(sent).toEqual(['a', 'c']);
    // The gathered edit opened a window of its own: the next edit inside it waits too.
    jest.advanceTimersByTime(QUIET - 10);
    edits.next('d');
    expect(sent).toEqual(['a', 'c']);
    jest.advanceTimersByTime(QUIET);
    expect(sent).toEqual(['a', 'c', 'd']);
  });

  it('should send a gathered edit when the edits end, and nothing after unsubscribing', () => {
    const more = new Subject<string>();
    const out: string[] = [];
    const subscription = more.pipe(sendAfterQuiet(QUIET)).subscribe((v) => out.push(v));
    more.next('x');
    more.next('y');
    subscription.unsubscribe();
    jest.advanceTimersByTime(QUIET);
    expect(out).toEqual(['x']);
    edits.next('a');
    edits.next('b');
    edits.complete();
    expect(sent).toEqual(['a', 'b']);
  });
});
