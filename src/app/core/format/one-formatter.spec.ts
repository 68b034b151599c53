import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

/**
 * Every figure on screen goes through the one formatter (results/format-quantity.ts), so it
 * follows the user's significant figures. This guard lists the app's sources that round a
 * number on their own; only the formatter and the places that round coordinates (not text a
 * person reads) may.
 */
const ROOT = join(__dirname, '..', '..');
const ROUNDING = /\.(toFixed|toPrecision|toExponential|toLocaleString)\(|Intl\.NumberFormat/;
const ALLOWED = new Set([
  // The formatter itself.
  'features/editor/results/format-quantity.ts',
  // Tick positions rounded to 12 figures (their labels come from the formatter).
  'features/editor/results/plot-axes.ts',
  // SVG path coordinates.
  'features/editor/design/spark-plot.component.ts',
]);

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sources(path);
    return /\.(ts|html)$/.test(name) && !name.endsWith('.spec.ts') ? [path] : [];
  });
}

describe('one number formatter', () => {
  it('should leave rounding for display to the formatter', () => {
    const offenders = sources(ROOT)
      .map((path) => relative(ROOT, path).split('\\').join('/'))
      .filter((file) => !ALLOWED.has(file))
      .filter((file) => ROUNDING.test(readFileSync(join(ROOT, file), 'utf8')));
    expect(offenders).toEqual([]);
  });
});
