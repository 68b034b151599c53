import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { readExample, readExamples } from './examples';

const valid = {
  name: 'Tiny',
  settings: { f0Hz: 1e6, sweep: { startHz: 1e5, stopHz: 1e7, points: 11 } },
  stages: [
    { id: 's', type: 'resistive-generator' },
    { id: 'l', type: 'envelope-detector' },
  ],
};

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'cw-examples-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('examples', () => {
  it('should strip variantOf and fill the document defaults', async () => {
    writeFileSync(
      path.join(dir, 'tiny.chain.json'),
      JSON.stringify({ ...valid, variantOf: 'other' }),
    );
    const example = await readExample(dir, 'tiny');
    expect(example.variantOf).toBe('other');
    expect(example.document).not.toHaveProperty('variantOf');
    expect(example.document.settings.temperatureK).toBe(290);
  });

  it('should name the file and the field of an invalid example', async () => {
    writeFileSync(path.join(dir, 'broken.chain.json'), JSON.stringify({ ...valid, stages: [] }));
    await expect(readExample(dir, 'broken')).rejects.toThrow(
      'examples: broken.chain.json is not a valid chain: stages: a chain needs at least a source and a load',
    );
  });

  it('should list valid examples only, warning about the others', async () => {
    writeFileSync(path.join(dir, 'tiny.chain.json'), JSON.stringify(valid));
    writeFileSync(path.join(dir, 'junk.chain.json'), '{ not json');
    writeFileSync(path.join(dir, 'notes.txt'), 'not an example');
    const warn = jest.spyOn(console, 'warn').mockImplementation(() => undefined);
    const examples = await readExamples(dir);
    expect(examples.map((e) => e.key)).toEqual(['tiny']);
    expect(warn).toHaveBeenCalledWith(
      expect.stringContaining('junk.chain.json is not readable JSON'),
    );
  });

  it('should refuse keys that could leave the folder', async () => {
    await expect(readExample(dir, '../package')).rejects.toThrow('no example "../package"');
  });
});
