import { HttpErrorResponse } from '@angular/common/http';
import { Submission } from './submission';

describe('Submission', () => {
  it('should be busy while it runs and ignore a second run meanwhile', async () => {
    const s = new Submission();
    let release!: () => void;
    const work = jest.fn(() => new Promise<void>((r) => (release = r)));
    const first = s.run(work);
    expect(s.busy()).toBe(true);
    await s.run(work);
    expect(work).toHaveBeenCalledTimes(1);
    release();
    await first;
    expect(s.busy()).toBe(false);
    expect(s.failure()).toBe('');
  });

  it("should show the server's words for a failure and clear them on the next run", async () => {
    const s = new Submission();
    const refused = new HttpErrorResponse({
      status: 422,
      error: { error: 'validation', message: 'this password is too easy to guess' },
    });
    await s.run(() => Promise.reject(refused));
    expect(s.failure()).toContain('This password is too easy to guess');
    expect(s.busy()).toBe(false);
    await s.run(() => Promise.resolve());
    expect(s.failure()).toBe('');
  });

  it('should leave a failure its handler took to the handler', async () => {
    const s = new Submission();
    const handled: unknown[] = [];
    await s.run(
      () => Promise.reject(new Error('closed')),
      (e) => handled.push(e) > 0,
    );
    expect(handled).toHaveLength(1);
    expect(s.failure()).toBe('');
  });
});
