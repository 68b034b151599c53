/**
 * The bench names when a browser run took a figure: the time the run wrote into its file,
 * not the file's modification time, which copying the file moves.
 */
import { mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { measuredWhen } from '../../scripts/bench/rows';

let dir: string;
beforeAll(() => (dir = mkdtempSync(join(tmpdir(), 'cw-when-'))));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function figureFile(modified: Date): string {
  const file = join(dir, `figure-${modified.getTime()}.json`);
  writeFileSync(file, '{}');
  utimesSync(file, modified, modified);
  return file;
}

describe('measuredWhen', () => {
  const copiedAt = new Date('2026-12-03T19:34:10Z');

  it("gives the run's own time when the file has one, whatever the file's time", () => {
    const file = figureFile(copiedAt);
    expect(measuredWhen(file, { measuredAt: '2026-12-02T08:05:59.123Z' })).toBe('2026-12-02 08:05');
  });

  it("falls back to the file's time for a file without one, or with one that is no date", () => {
    const file = figureFile(copiedAt);
    expect(measuredWhen(file, {})).toBe('2026-12-03 19:34');
    expect(measuredWhen(file, { measuredAt: 'yesterday-ish' })).toBe('2026-12-03 19:34');
    expect(measuredWhen(file, { measuredAt: 1764700000000 })).toBe('2026-12-03 19:34');
  });
});
