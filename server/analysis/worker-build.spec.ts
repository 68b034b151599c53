import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { buildSync } from 'esbuild';
import { parseQuantity } from '../../shared/units/parse';
import { REPO_ROOT } from '../config';
import { serverBundleOptions } from './worker-build';

describe('the server bundles', () => {
  const options = serverBundleOptions(REPO_ROOT);

  it('leave every npm package to node_modules but mathjs', () => {
    const manifest = JSON.parse(readFileSync(path.join(REPO_ROOT, 'package.json'), 'utf8'));
    expect(options.external).toContain('express');
    expect(options.external).toContain('@mikro-orm/core/*');
    expect(options.external).not.toContain('mathjs');
    expect(options.external).toHaveLength(
      2 * (Object.keys({ ...manifest.dependencies, ...manifest.devDependencies }).length - 1),
    );
  });

  it('carry only the mathjs the unit parser uses, which reads values as the sources do', () => {
    // Inside the repository, so the bundle's require() finds node_modules (a fresh clone
    // has no dist/ yet).
    mkdirSync(path.join(REPO_ROOT, 'dist'), { recursive: true });
    const dir = mkdtempSync(path.join(REPO_ROOT, 'dist', 'bundle-spec-'));
    try {
      const outfile = path.join(dir, 'parse.js');
      buildSync({
        ...options,
        sourcemap: false,
        entryPoints: [path.join(REPO_ROOT, 'shared', 'units', 'parse.ts')],
        outfile,
      });
      const code = readFileSync(outfile, 'utf8');
      expect(code).not.toMatch(/require\("mathjs/);
      // The whole library bundled so is 1.6 MB of JavaScript; what the parser needs, 0.7 MB.
      expect(code.length).toBeLessThan(1_000_000);
      // eslint-disable-next-line @typescript-eslint/no-require-imports
      const bundled = require(outfile) as { parseQuantity: typeof parseQuantity };
      const cases: [string, Parameters<typeof parseQuantity>[1]][] = [
        ['22 uH', 'henry'],
        ['4p7', 'farad'],
        ['1/(2*pi*1 MHz*50)', 'farad'],
        ['-95 dBm', 'dbm'],
        ['sqrt(2)*50', 'ohm'],
        ['7 MHz', 'hertz'],
        ['10 pF', 'henry'],
        ['2 kHz + 1', 'hertz'],
      ];
      for (const [text, kind] of cases) {
        expect(bundled.parseQuantity(text, kind)).toEqual(parseQuantity(text, kind));
      }
      expect(bundled.parseQuantity('22 uH', 'henry')).toEqual({ ok: true, value: 22e-6 });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
