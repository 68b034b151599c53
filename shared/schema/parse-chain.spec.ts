import { ChainDocumentError, jsonPath, parseChainDocument } from './parse-chain';

const written = {
  name: 'Hand-written',
  settings: { f0Hz: 7e6, sweep: { startHz: 5e6, stopHz: 9e6, points: 21 } },
  stages: [
    { id: 'g', type: 'resistive-generator', values: { r: 50 } },
    { id: 'l', type: 'rc-load' },
  ],
};

describe('parseChainDocument', () => {
  it('fills the schema defaults the engine reads', () => {
    const doc = parseChainDocument(written);
    expect(doc.settings.temperatureK).toBe(290);
    expect(doc.settings.sweep.scale).toBe('lin');
    expect(doc.settings.thresholds.loadingWarn).toBe(0.5);
    expect(doc.stages[1]).toEqual({ id: 'l', type: 'rc-load', label: '', values: {} });
  });

  it('names the path and the problem of every field it refuses', () => {
    const bad = {
      ...written,
      settings: { ...written.settings, f0Hz: -1 },
      stages: [written.stages[0], { id: 'l', type: 'rc-load', values: { r: [1] } }],
    };
    let error: unknown;
    try {
      parseChainDocument(bad, 'chain.json');
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ChainDocumentError);
    const { problems, message } = error as ChainDocumentError;
    expect(problems.map((p) => jsonPath(p.path))).toEqual([
      '$.settings.f0Hz',
      '$.stages[1].values.r',
    ]);
    expect(message).toMatch(/^chain\.json is not a valid chain: \$\.settings\.f0Hz: design frequency must be above 0; \$\.stages\[1\]\.values\.r: /); // prettier-ignore
  });

  it('writes keys that are not identifiers in brackets', () => {
    expect(jsonPath(['stages', 0, 'values', 'a b'])).toBe('$.stages[0].values["a b"]');
  });
});
